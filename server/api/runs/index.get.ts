import { z } from 'zod'
import { MAX_ID } from '#shared/schemas/input'
import { RUN_STATUSES } from '#shared/rules/enums'
import { storedTitlesIn } from '#shared/procedures'

const QuerySchema = z.object({
  status: z.enum([...RUN_STATUSES, 'all'], { error: 'status must be active, finished, abandoned, withdrawn or all.' }).default('active'),
  machineId: z.coerce.number({ error: 'machineId must be a number.' }).int().positive('machineId must be a positive number.').max(MAX_ID, 'machineId is not a known id.').optional(),
  limit: z.coerce.number({ error: 'limit must be a number.' }).int().min(1, 'limit must be at least 1.').max(200, 'limit must be at most 200.').default(50),
})

// Runs of the shop for the Floor (in progress) and history lists.
export default defineEventHandler(async (event) => {
  const user = await requireShopUser(event)
  const q = queryValid(event, QuerySchema)
  const where = [eq(tables.runs.shopId, user.shopId)]
  if (q.status !== 'all') where.push(eq(tables.runs.status, q.status))
  if (q.machineId) where.push(eq(tables.runs.machineId, q.machineId))
  // Runs with their machine, procedure version and the person who started them
  const rows = await useDB().select({
    id: tables.runs.id, status: tables.runs.status, mode: tables.runs.mode, machineId: tables.runs.machineId,
    machineName: tables.machines.name, procedureVersionId: tables.runs.procedureVersionId,
    procedureId: tables.procedureVersions.procedureId, procedureTitle: tables.procedureVersions.title,
    version: tables.procedureVersions.version, startedBy: tables.runs.startedBy, startedByName: tables.users.name,
    currentStepKey: tables.runs.currentStepKey, startedAt: tables.runs.startedAt, finishedAt: tables.runs.finishedAt,
    updatedAt: tables.runs.updatedAt, translations: tables.procedureVersions.translations,
  }).from(tables.runs)
    .innerJoin(tables.machines, eq(tables.machines.id, tables.runs.machineId))
    .innerJoin(tables.procedureVersions, eq(tables.procedureVersions.id, tables.runs.procedureVersionId))
    .innerJoin(tables.users, eq(tables.users.id, tables.runs.startedBy))
    .where(and(...where))
    .orderBy(desc(tables.runs.startedAt))
    .limit(q.limit)
  if (!rows.length) return []
  // Titles of the current steps
  const steps = await useDB().select({ versionId: tables.procedureSteps.versionId, key: tables.procedureSteps.key, title: tables.procedureSteps.title, position: tables.procedureSteps.position })
    .from(tables.procedureSteps).where(inArray(tables.procedureSteps.versionId, [...new Set(rows.map(r => r.procedureVersionId))]))
  const byKey = new Map(steps.map(s => [`${s.versionId}:${s.key}`, s]))
  const counts = new Map<number, number>()
  for (const s of steps) counts.set(s.versionId, (counts.get(s.versionId) ?? 0) + 1)
  // The procedure's and the step's titles in the reader's language where the version has them
  const lang = callerLanguage(event)
  const translated = new Map<number, ReturnType<typeof storedTitlesIn>>()
  for (const r of rows) if (!translated.has(r.procedureVersionId)) translated.set(r.procedureVersionId, storedTitlesIn(r.translations, lang))
  return rows.map(({ translations: _stored, ...r }) => {
    const step = r.currentStepKey ? byKey.get(`${r.procedureVersionId}:${r.currentStepKey}`) : undefined
    const titles = translated.get(r.procedureVersionId)!
    return {
      ...r, procedureTitle: titles.procedure(r.procedureTitle),
      currentStepTitle: step ? titles.step(step.key, step.title) : null,
      currentStepNumber: step ? step.position + 1 : null, stepCount: counts.get(r.procedureVersionId) ?? 0,
    }
  })
})
