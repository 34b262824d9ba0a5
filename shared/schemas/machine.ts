import { z } from 'zod'
import { DWELL_UNITS, SPINDLE_KINDS, UNITS } from '../rules/enums'

export { DWELL_UNITS, SPINDLE_KINDS }
const mm = (label: string, max: number, min = 1) => z.number({ error: `${label} must be a number.` })
  .finite(`${label} must be a number.`)
  .positive(`${label} must be more than 0.`)
  .min(min, `${label} must be at least ${min} mm.`)
  .max(max, `${label} must be at most ${max} mm.`)

// Lengths are stored in millimetres; forms convert from the machine's preferred units first.
const base = z.object({
  name: z.string({ error: 'Enter a name.' }).trim().min(1, 'Enter a name.').max(80, 'Keep the name under 80 characters.'),
  travelXMm: mm('X travel', 10_000),
  travelYMm: mm('Y travel', 10_000),
  travelZMm: mm('Z travel', 1_000),
  units: z.enum(UNITS, { error: 'Units must be mm or in.' }),
  spindleKind: z.enum(SPINDLE_KINDS, { error: 'Pick the spindle kind.' }),
  hasLengthSensor: z.boolean({ error: 'Say whether the machine has a tool-length sensor.' }),
  spoilboardMaterial: z.string().trim().min(1, 'Enter the spoilboard material.').max(60, 'Keep the material under 60 characters.'),
  spoilboardNominalMm: mm('Nominal spoilboard thickness', 200),
  spoilboardMinMm: mm('Minimum spoilboard thickness', 200),
  // Lower limits are common practice, no published source: a router slower than these is a typing mistake.
  accelMmS2: z.number({ error: 'Acceleration must be a number.' }).finite('Acceleration must be a number.').min(10, 'Acceleration must be at least 10 mm/s².').max(20_000, 'Acceleration must be at most 20000 mm/s².').optional(),
  rapidMmMin: z.number({ error: 'Rapid rate must be a number.' }).finite('Rapid rate must be a number.').min(100, 'Rapid rate must be at least 100 mm/min.').max(100_000, 'Rapid rate must be at most 100000 mm/min.').optional(),
  dwellUnit: z.enum(DWELL_UNITS, { error: 'Dwell unit must be \'seconds\' or \'milliseconds\'.' }).optional(),
  notes: z.string().max(2000, 'Keep notes under 2000 characters.').nullable().optional(),
}).strict()

const minBelowNominal = (v: { spoilboardNominalMm?: number, spoilboardMinMm?: number }) =>
  v.spoilboardNominalMm === undefined || v.spoilboardMinMm === undefined || v.spoilboardMinMm < v.spoilboardNominalMm

export const MachineCreateSchema = base.refine(minBelowNominal, {
  path: ['spoilboardMinMm'],
  message: 'The minimum thickness must be less than the nominal thickness.',
})
export type MachineInput = z.infer<typeof MachineCreateSchema>

export const MachinePatchSchema = base.partial().refine(minBelowNominal, {
  path: ['spoilboardMinMm'],
  message: 'The minimum thickness must be less than the nominal thickness.',
}).refine(v => Object.keys(v).length > 0, { message: 'Nothing to change.' })
export type MachinePatch = z.infer<typeof MachinePatchSchema>
