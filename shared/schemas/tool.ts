// The shop's cutters (Cutters screen, GET/POST/PATCH /api/tools). Sizes are typed in the
// person's units and stored in millimetres, like every length in Jogwise.
import { z } from 'zod'
import { MAX_RPM, MIN_RPM } from '../machining/surfacing-input'

import { TOOL_KINDS, type ToolKind } from '../rules/enums'

export { TOOL_KINDS, type ToolKind }
/** Limits in mm; common practice, no published source: router cutters run 0.5 to 150 mm across. */
export const TOOL_LIMITS_MM = { minDiameter: 0.5, maxDiameter: 150 } as const

const num = (label: string) => z.number({ error: `${label} must be a number.` }).finite(`${label} must be a number.`)

const fields = {
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(80, 'Keep the name under 80 characters.'),
  kind: z.enum(TOOL_KINDS, { error: 'Pick the kind of cutter.' }),
  diameterMm: num('Diameter').min(TOOL_LIMITS_MM.minDiameter, `Diameter must be at least ${TOOL_LIMITS_MM.minDiameter} mm.`)
    .max(TOOL_LIMITS_MM.maxDiameter, `Diameter must be at most ${TOOL_LIMITS_MM.maxDiameter} mm.`),
  flutes: num('Flutes').int('Flutes must be a whole number.').min(1, 'A cutter has at least 1 flute.').max(16, 'More than 16 flutes is not a router cutter.'),
  cornerRadiusMm: num('Corner radius').min(0, 'Corner radius cannot be negative.').max(TOOL_LIMITS_MM.maxDiameter / 2, `Corner radius must be at most ${TOOL_LIMITS_MM.maxDiameter / 2} mm.`),
  maxRpm: num('Maximum speed').int('Maximum speed must be a whole number of rpm.').min(MIN_RPM, `Maximum speed must be at least ${MIN_RPM} rpm.`)
    .max(MAX_RPM, `Maximum speed must be at most ${MAX_RPM} rpm.`),
  notes: z.string({ error: 'Notes must be text.' }).trim().max(500, 'Keep notes under 500 characters.').nullable().optional(),
}

// A corner radius is at most half the diameter (a ball nose); more is a typing mistake.
const radiusFits = (v: { diameterMm?: number, cornerRadiusMm?: number }) =>
  v.diameterMm === undefined || v.cornerRadiusMm === undefined || v.cornerRadiusMm <= v.diameterMm / 2 + 1e-9
const radiusIssue = { path: ['cornerRadiusMm'], message: 'The corner radius cannot be more than half the diameter.' }

export const ToolCreateSchema = z.object({ ...fields, cornerRadiusMm: fields.cornerRadiusMm.default(0) }).strict().refine(radiusFits, radiusIssue)
export type ToolInput = z.input<typeof ToolCreateSchema>

export const ToolPatchSchema = z.object(fields).partial().strict().refine(radiusFits, radiusIssue)
  .refine(v => Object.keys(v).length > 0, { message: 'Nothing to change.' })
