import { z } from 'zod'
import { ProcedureSchema } from '../procedures/schema'

/** Body of publishing a procedure (new or a new version of an existing one). */
export const ProcedurePublishSchema = z.object({
  procedure: ProcedureSchema,
  changeNote: z.string({ error: 'The change note must be text.' }).trim().max(500, 'Keep the change note under 500 characters.').optional(),
}).strict()
export type ProcedurePublishInput = z.input<typeof ProcedurePublishSchema>
