import { z } from 'zod'
import { MAX_ID } from './input'
import { MAX_READING, RUN_MODES } from '../runs/events'
import { MAX_STEPS } from '../procedures/schema'
import { reasonProblem } from '../procedures/text'

// A run done on a printed sheet and entered afterwards by a trainer or the owner
// (POST /api/paper-runs and the form on pages/paper-runs/new.vue). The server checks the rest
// against the shop's rows: the people, the machine, the version and its steps.

/** How long one run on paper may take; a longer one is a typing error in a date. */
export const MAX_PAPER_RUN_HOURS = 24
/** How far back a paper run may be entered. Sheets are kept for months, rarely longer. */
export const MAX_PAPER_RUN_AGE_DAYS = 366
/** Clock difference tolerated between the form's device and the server. */
export const PAPER_CLOCK_SLACK_MS = 5 * 60_000

const id = (label: string) => z.number({ error: `${label} must be chosen.` })
  .int(`${label} must be a whole number.`).positive(`${label} must be chosen.`).max(MAX_ID, `${label} is not a known id.`)

const moment = (label: string) => z.iso.datetime({ offset: true, error: `${label} must be a date and time with a time zone, e.g. 2026-03-01T08:15:00Z.` })

const stepKey = z.string({ error: 'Step key must be text.' }).trim().min(1, 'Step key is required.').max(60, 'Step key must be at most 60 characters.')

const reading = z.object({
  stepKey,
  value: z.number({ error: 'Reading must be a number.' })
    .min(-MAX_READING, `Reading must be at least -${MAX_READING}.`).max(MAX_READING, `Reading must be at most ${MAX_READING}.`),
  reason: z.string({ error: 'Reason must be text.' }).trim().max(1000, 'Reason must be at most 1000 characters.').optional()
    .transform(r => (r ? r : undefined)),
}).strict()

export const PaperRunSchema = z.object({
  // Made by the form, so sending the same sheet twice stores it once.
  runId: z.uuid({ error: 'Run id must be a UUID made by the form.' }),
  machineId: id('Machine'),
  procedureVersionId: id('Procedure version'),
  operatorId: id('Who did the run'),
  mode: z.enum(RUN_MODES, { error: 'Mode must be guided or solo.' }),
  startedAt: moment('Started at'),
  finishedAt: moment('Finished at'),
  outcome: z.enum(['finished', 'stopped'], { error: 'Outcome must be finished or stopped.' }),
  stopReason: z.string({ error: 'Reason for stopping must be text.' }).trim().max(1000, 'Reason for stopping must be at most 1000 characters.').optional(),
  ticked: z.array(stepKey, { error: 'Ticked steps must be a list of step keys.' }).max(MAX_STEPS, `At most ${MAX_STEPS} steps can be ticked.`),
  readings: z.array(reading, { error: 'Readings must be a list.' }).max(MAX_STEPS, `At most ${MAX_STEPS} readings.`),
  signerId: id('Who signed').optional(),
  note: z.string({ error: 'Note must be text.' }).trim().max(2000, 'Note must be at most 2000 characters.').optional()
    .transform(n => (n ? n : undefined)),
}).strict().superRefine((v, ctx) => {
  const start = Date.parse(v.startedAt)
  const end = Date.parse(v.finishedAt)
  if (end < start) ctx.addIssue({ code: 'custom', path: ['finishedAt'], message: 'Finished at must not be before started at.' })
  else if (end - start > MAX_PAPER_RUN_HOURS * 3_600_000) ctx.addIssue({ code: 'custom', path: ['finishedAt'], message: `A run on paper may take at most ${MAX_PAPER_RUN_HOURS} hours; check the dates.` })
  if (end > Date.now() + PAPER_CLOCK_SLACK_MS) ctx.addIssue({ code: 'custom', path: ['finishedAt'], message: 'Finished at is in the future.' })
  if (start < Date.now() - MAX_PAPER_RUN_AGE_DAYS * 86_400_000) ctx.addIssue({ code: 'custom', path: ['startedAt'], message: `Started at is more than ${MAX_PAPER_RUN_AGE_DAYS} days ago; such an old sheet cannot be entered.` })
  if (new Set(v.ticked).size !== v.ticked.length) ctx.addIssue({ code: 'custom', path: ['ticked'], message: 'A step is ticked twice.' })
  const seen = new Set<string>()
  v.readings.forEach((r, i) => {
    if (seen.has(r.stepKey)) ctx.addIssue({ code: 'custom', path: ['readings', i, 'stepKey'], message: 'This check already has a reading.' })
    seen.add(r.stepKey)
  })
  if (v.outcome === 'stopped') {
    const problem = reasonProblem(v.stopReason)
    if (problem) ctx.addIssue({ code: 'custom', path: ['stopReason'], message: `Reason for stopping ${problem}.` })
  }
  if (v.mode === 'guided' && v.signerId === undefined && v.outcome === 'finished') {
    ctx.addIssue({ code: 'custom', path: ['signerId'], message: 'A guided run needs the trainer or owner who signed the sheet.' })
  }
  if (v.signerId !== undefined && v.signerId === v.operatorId && v.mode === 'guided') {
    ctx.addIssue({ code: 'custom', path: ['signerId'], message: 'In a guided run the signer must be someone other than the person doing the run.' })
  }
})
// The photo of the sheet, uploaded after the run is stored (uploads belong to a run).
export const PaperSheetSchema = z.object({
  uploadId: z.uuid({ error: 'Upload id must be the id of a photo uploaded for this run.' }),
}).strict()

export type PaperRun = z.output<typeof PaperRunSchema>
export type PaperRunInput = z.input<typeof PaperRunSchema>
