/**
 * After a submit that the form's own check refused: move focus to the first field with an error
 * and scroll it into view, so a long form (Add machine, Planner, Board) never hides its reason
 * above or below the visible area. Fields show errors as `.field-error` inside their `.field`.
 */
export async function focusFirstError(form: HTMLElement | null | undefined) {
  await nextTick()
  const error = form?.querySelector<HTMLElement>('.field-error, [aria-invalid="true"]')
  if (!error) return
  const field = error.matches('[aria-invalid="true"]') ? error : error.closest('.field, fieldset')
  const target = field?.matches('input, select, textarea') ? field as HTMLElement : field?.querySelector<HTMLElement>('input:not([type=hidden]), select, textarea') ?? error
  target.scrollIntoView({ block: 'center' })
  target.focus({ preventScroll: true })
}
