import { z } from 'zod'
import { PAPER_SIZES } from '../paper/sizes'

// The shop's own settings that the owner changes (PATCH /api/shop).
export const ShopSettingsSchema = z.object({
  paperSize: z.enum(PAPER_SIZES, { error: `Paper size must be one of ${PAPER_SIZES.join(', ')}.` }),
}).strict()
export type ShopSettings = z.output<typeof ShopSettingsSchema>
