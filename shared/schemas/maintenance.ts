import { z } from 'zod'
import { MAX_ID } from './input'

// A maintenance interval: how often a procedure must be run on a machine (or on every machine
// in service when machineId is null), by calendar days, by spindle hours, or both.

const id = (label: string) => z.number({ error: `Pick a ${label}.` }).int(`Pick a ${label}.`).positive(`Pick a ${label}.`).max(MAX_ID, `Pick a ${label}.`)
const everyDays = z.number({ error: 'Days must be a number.' }).int('Days must be a whole number.')
  .min(1, 'Days must be at least 1.').max(3650, 'Days must be at most 3650 (ten years).').nullable()
const everySpindleHours = z.number({ error: 'Spindle hours must be a number.' }).finite('Spindle hours must be a number.')
  .min(0.5, 'Spindle hours must be at least 0.5.').max(100_000, 'Spindle hours must be at most 100000.').nullable()

const atLeastOne = (v: { everyDays?: number | null, everySpindleHours?: number | null }) => v.everyDays != null || v.everySpindleHours != null
const atLeastOneIssue = { path: ['everyDays'], message: 'Give a number of days, of spindle hours, or both.' }

export const IntervalCreateSchema = z.object({
  procedureId: id('procedure'),
  machineId: id('machine').nullable().default(null),
  everyDays: everyDays.default(null),
  everySpindleHours: everySpindleHours.default(null),
}).strict().refine(atLeastOne, atLeastOneIssue)
export type IntervalInput = z.input<typeof IntervalCreateSchema>

export const IntervalPatchSchema = z.object({
  procedureId: id('procedure').optional(),
  machineId: id('machine').nullable().optional(),
  everyDays: everyDays.optional(),
  everySpindleHours: everySpindleHours.optional(),
}).strict().refine(v => Object.keys(v).length > 0, { path: [], message: 'Nothing to change.' })
