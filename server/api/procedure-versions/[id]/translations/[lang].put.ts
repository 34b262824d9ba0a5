import { z } from 'zod'
import { VersionTranslationSchema } from '#shared/procedures'
import { MAX_ID } from '#shared/schemas/input'
import { LEAD_ROLES } from '#shared/types/roles'

const ParamsSchema = z.object({
  id: z.coerce.number().int().positive().max(MAX_ID),
  lang: z.string().regex(/^[a-z]{2,3}$/),
})

// Writes one language's translation of a published version (the Library editor). The original
// steps never change, so a translation may be written or corrected after runs have used it;
// each change is on the audit trail.
export default defineEventHandler(async (event) => {
  const { id, lang } = paramsValid(event, ParamsSchema)
  const user = await requireRole(event, ...LEAD_ROLES)
  if (!isLanguage(lang)) throw notFound('language')
  const version = (await loadVersions(user.shopId, [id])).get(id)
  if (!version) throw notFound('procedure version')
  const body = await readValid(event, VersionTranslationSchema)
  const keys = new Set(version.steps.map(s => s.key))
  const unknown = Object.keys(body.steps).filter(k => !keys.has(k))
  if (unknown.length) {
    const issues = unknown.map(k => ({ path: `steps.${k}`, message: `Version ${version.version} has no step "${k}".` }))
    throw invalidIssues(issues)
  }
  // Empty texts are left out: the step shows the original there.
  const steps = Object.fromEntries(Object.entries(body.steps).map(([k, t]) => [k, Object.fromEntries(Object.entries(t).filter(([, v]) => v !== '' && v !== undefined))])
    .filter(([, t]) => Object.keys(t as object).some(f => f !== 'draft')))
  const entry = { ...(body.title && { title: body.title }), ...(body.summary && { summary: body.summary }), steps }
  const translations = { ...version.translations, [lang]: entry }
  await withWriteRetry(() => useDB().transaction(async (tx) => {
    // This version's translations, within the shop
    await tx.update(tables.procedureVersions).set({ translations })
      .where(and(eq(tables.procedureVersions.id, id), eq(tables.procedureVersions.shopId, user.shopId)))
    await recordAudit(tx, user, 'procedure.translated', 'procedure', version.procedureId, { version: version.version, lang, steps: Object.keys(steps).length })
  }))
  return { id, lang, translation: entry }
})
