import { carryTranslations, parseProcedure, readTranslations, STARTER_LIBRARY, STARTER_TRANSLATIONS, stepFromRow, stepToRow } from '#shared/procedures'
import type { Procedure, ProcedureStep, Translations } from '#shared/procedures'
import type { DB, Tx } from './db'

export interface VersionWithSteps {
  id: number
  procedureId: number
  version: number
  title: string
  summary: string
  category: string
  changeNote: string | null
  createdAt: Date
  steps: ProcedureStep[]
  /** Translations by language (shared/procedures/translation.ts); {} when none. */
  translations: Translations
}

/**
 * Writes a new, never-changing version of a procedure and makes it current. Runs keep pointing
 * at the version they started with.
 */
export async function publishVersion(tx: Tx | DB, args: { shopId: number, procedureId: number, procedure: Procedure, createdBy: number | null, changeNote?: string | null, translations?: Translations }) {
  const [last] = await tx.select({ v: sql<number>`coalesce(max(${tables.procedureVersions.version}), 0)` })
    .from(tables.procedureVersions).where(eq(tables.procedureVersions.procedureId, args.procedureId))
  const version = Number(last?.v ?? 0) + 1
  // The translations of the version this one replaces, kept as drafts for unchanged steps
  const [proc] = await tx.select({ current: tables.procedures.currentVersionId }).from(tables.procedures)
    .where(eq(tables.procedures.id, args.procedureId)).limit(1)
  // (a previous version that no longer reads is no reason to refuse the new one)
  const previous = proc?.current
    ? (await loadVersions(args.shopId, [proc.current], tx as DB).catch(() => undefined))?.get(proc.current)
    : undefined
  const translations = args.translations
    ?? (previous ? carryTranslations(previous, args.procedure) : {})
  const [{ id: versionId }] = await tx.insert(tables.procedureVersions).values({
    shopId: args.shopId,
    procedureId: args.procedureId,
    version,
    title: args.procedure.title,
    summary: args.procedure.summary,
    changeNote: args.changeNote ?? null,
    translations: Object.keys(translations).length ? translations : null,
    createdBy: args.createdBy,
  }).$returningId() as [{ id: number }]
  await tx.insert(tables.procedureSteps).values(args.procedure.steps.map((step, position) => ({ ...stepToRow(step), versionId, position })))
  await tx.update(tables.procedures).set({ currentVersionId: versionId, category: args.procedure.category })
    .where(eq(tables.procedures.id, args.procedureId))
  return { versionId, version }
}

/** Gives a new shop the starter library, version 1 of each procedure. */
export async function installStarterLibrary(tx: Tx | DB, shopId: number, createdBy: number | null) {
  for (const starter of STARTER_LIBRARY) {
    const parsed = parseProcedure(starter)
    if (!parsed.ok) throw new Error(`starter procedure ${starter.slug} is invalid: ${parsed.issues[0]?.path} ${parsed.issues[0]?.message}`)
    const [{ id: procedureId }] = await tx.insert(tables.procedures).values({ shopId, slug: starter.slug, category: starter.category }).$returningId() as [{ id: number }]
    // The starter library comes with its Spanish (and any later language's) text.
    await publishVersion(tx, { shopId, procedureId, procedure: parsed.procedure, createdBy, changeNote: 'Starter library', translations: STARTER_TRANSLATIONS[starter.slug] ?? {} })
  }
}

// A published version's steps never change (an edit publishes a new version, a new row), so the
// sync merge's fold keeps them per process instead of reading and checking them again on every
// batch (issue 14). Titles, categories and translations can change and are not kept here.
const STEPS_KEPT = 500
const keptSteps = new Map<string, { procedureId: number, steps: readonly ProcedureStep[] }>()

/** Each version's procedure and steps, only within one shop: from memory, else loadVersions. */
export async function loadVersionSteps(shopId: number, versionIds: number[], db: DB = useDB()) {
  const out = new Map<number, { procedureId: number, steps: readonly ProcedureStep[] }>()
  const missing: number[] = []
  for (const id of versionIds) {
    const kept = keptSteps.get(`${shopId}:${id}`)
    if (kept) out.set(id, kept)
    else missing.push(id)
  }
  if (!missing.length) return out
  for (const [id, v] of await loadVersions(shopId, missing, db)) {
    const entry = { procedureId: v.procedureId, steps: v.steps }
    out.set(id, entry)
    // The oldest kept version makes room (a Map iterates in insertion order)
    if (keptSteps.size >= STEPS_KEPT) keptSteps.delete(keptSteps.keys().next().value!)
    keptSteps.set(`${shopId}:${id}`, entry)
  }
  return out
}

/** Loads versions with their steps, only within one shop. A stored step that no longer passes
 *  the schema is reported, never silently shown. */
export async function loadVersions(shopId: number, versionIds: number[], db: DB = useDB()): Promise<Map<number, VersionWithSteps>> {
  const out = new Map<number, VersionWithSteps>()
  if (!versionIds.length) return out
  // The versions and their procedures' categories
  const versions = await db.select({
    id: tables.procedureVersions.id, procedureId: tables.procedureVersions.procedureId, version: tables.procedureVersions.version,
    title: tables.procedureVersions.title, summary: tables.procedureVersions.summary, changeNote: tables.procedureVersions.changeNote,
    createdAt: tables.procedureVersions.createdAt, category: tables.procedures.category,
    translations: tables.procedureVersions.translations,
  }).from(tables.procedureVersions)
    .innerJoin(tables.procedures, eq(tables.procedures.id, tables.procedureVersions.procedureId))
    .where(and(eq(tables.procedureVersions.shopId, shopId), inArray(tables.procedureVersions.id, versionIds)))
  if (!versions.length) return out
  // Their steps in order
  const steps = await db.select().from(tables.procedureSteps)
    .where(inArray(tables.procedureSteps.versionId, versions.map(v => v.id)))
    .orderBy(asc(tables.procedureSteps.versionId), asc(tables.procedureSteps.position))
  // A translation that no longer passes its schema is left out rather than break the version.
  for (const v of versions) out.set(v.id, { ...v, translations: readTranslations(v.translations), steps: [] })
  for (const row of steps) {
    const parsed = stepFromRow({ ...row, settings: row.settings ?? null })
    if (!parsed.ok) throw createError({ statusCode: 500, statusMessage: 'Stored step is invalid', message: `Step ${row.key} of version ${row.versionId} no longer passes its checks: ${parsed.issues[0]?.message}` })
    out.get(row.versionId)!.steps.push(parsed.step)
  }
  return out
}
