import { v7 as uuidv7 } from 'uuid'
import { parseTypedNumber } from '#shared/numbers'
import type { FieldIssue } from '#shared/schemas/issues'
import type { ProcedureStep } from '#shared/procedures'

// The state of the "Enter a paper run" form and its sending: the run first, then the photo of
// the sheet (uploads belong to a run), then the photo filed with the run.

export function usePaperRunForm() {
  const form = reactive({
    runId: uuidv7(), machineId: 0, procedureId: 0, operatorId: 0, signerId: 0, mode: 'guided' as 'guided' | 'solo',
    startedAt: '', finishedAt: '', outcome: 'finished' as 'finished' | 'stopped', stopReason: '', note: '',
    ticked: [] as string[], readings: {} as Record<string, { value: string, reason: string }>,
  })
  const photo = ref<File | null>(null)
  const { t } = useI18n()

  function setSteps(steps: ProcedureStep[]) {
    form.ticked = []
    form.readings = Object.fromEntries(steps.filter(s => s.kind === 'check').map(s => [s.key, { value: '', reason: '' }]))
  }

  /** The API body; a typed reading that is no number stays text, so the server names it. */
  function body(versionId: number) {
    const local = (v: string) => (v ? new Date(v).toISOString() : v)
    return {
      runId: form.runId, machineId: form.machineId || undefined, procedureVersionId: versionId || undefined,
      operatorId: form.operatorId || undefined, mode: form.mode, startedAt: local(form.startedAt), finishedAt: local(form.finishedAt),
      outcome: form.outcome, ...(form.outcome === 'stopped' ? { stopReason: form.stopReason } : {}),
      ticked: form.ticked,
      readings: Object.entries(form.readings).filter(([, r]) => r.value.trim() !== '').map(([stepKey, r]) => {
        const n = parseTypedNumber(r.value)
        return { stepKey, value: Number.isFinite(n) ? n : r.value, ...(r.reason.trim() ? { reason: r.reason } : {}) }
      }),
      ...(form.signerId ? { signerId: form.signerId } : {}),
      ...(form.note.trim() ? { note: form.note } : {}),
    }
  }

  async function send(versionId: number): Promise<{ ok: true, runId: string, photoProblem: string } | { ok: false, issues: FieldIssue[] }> {
    try {
      await $fetch('/api/paper-runs', { method: 'POST', body: body(versionId) })
    }
    catch (e) {
      return { ok: false, issues: issuesOf(e, t('paper.run.saveFailed')) }
    }
    let photoProblem = ''
    if (photo.value) {
      try {
        const uploadId = uuidv7()
        await $fetch(`/api/uploads/${uploadId}`, { method: 'PUT', query: { runId: form.runId }, body: photo.value, headers: { 'content-type': 'application/octet-stream' } })
        await $fetch(`/api/paper-runs/${form.runId}/sheet`, { method: 'PUT', body: { uploadId } })
      }
      catch (e) { photoProblem = t('paper.run.photoNotSaved', { reason: reasonOf(e, t('paper.run.network')) }) }
    }
    return { ok: true, runId: form.runId, photoProblem }
  }

  return { form, photo, setSteps, send }
}
