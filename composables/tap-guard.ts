// One gesture, one action (a safety rule of the Run screen). When an action completes while a
// finger is still on the glass (a press-and-hold reaching its end), the next step's button is
// drawn under that finger and the lift would tap it. So after every action and every change of
// step the guarded area ignores input until every finger, mouse button and Enter/Space key is
// up, and then for SETTLE_MS more. A quick second tap (a double tap) restarts the wait.
//
// The state is per tablet, not per person, so module-level refs are safe here (STYLE.md §3).

/** How long the new step's controls stay inert after the last lift (issue: about 300–500 ms). */
export const SETTLE_MS = 400

const ready = ref(true)
const down = new Set<string>()
let timer: ReturnType<typeof setTimeout> | undefined
let installed = false

function settle() {
  clearTimeout(timer)
  timer = setTimeout(() => {
    if (down.size === 0) ready.value = true
  }, SETTLE_MS)
}

function release(id: string) {
  if (!down.delete(id)) return
  if (!ready.value && down.size === 0) settle()
}

const isKey = (e: KeyboardEvent) => e.key === 'Enter' || e.key === ' '

function install() {
  if (installed || typeof document === 'undefined') return
  installed = true
  // Capture phase on the document: these run before any handler of the page, blocked or not.
  document.addEventListener('pointerdown', e => down.add(`p${e.pointerId}`), true)
  document.addEventListener('pointerup', e => release(`p${e.pointerId}`), true)
  document.addEventListener('pointercancel', e => release(`p${e.pointerId}`), true)
  document.addEventListener('keydown', (e) => { if (isKey(e)) down.add(`k${e.key}`) }, true)
  document.addEventListener('keyup', (e) => { if (isKey(e)) release(`k${e.key}`) }, true)
  // A tab switch or a lost window can swallow the matching "up": do not wait for it forever.
  window.addEventListener('blur', () => {
    for (const id of [...down]) release(id)
  })
}

const isTextField = (t: EventTarget | null) => t instanceof HTMLElement && (t.tagName === 'TEXTAREA' || (t.tagName === 'INPUT' && !['radio', 'checkbox', 'button', 'submit', 'file'].includes((t as HTMLInputElement).type)))

/**
 * Blocks presses, clicks and keyboard activation inside `root` while the guard is not ready.
 * Returns `ready` (for the visible cue) and `lock()` (call it when an action is taken and when
 * the step changes).
 */
export function useTapGuard(root?: Ref<HTMLElement | null | undefined>) {
  function lock() {
    ready.value = false
    clearTimeout(timer)
    if (down.size === 0) settle()
  }

  function block(e: Event) {
    if (ready.value) return
    if (e instanceof KeyboardEvent && (!isKey(e) || isTextField(e.target))) return
    e.preventDefault()
    e.stopImmediatePropagation()
  }
  const kinds = ['click', 'pointerdown', 'touchstart', 'keydown', 'submit'] as const

  onMounted(() => {
    install()
    const el = root?.value
    if (!el) return
    // touchstart must not be passive, or preventDefault() cannot stop the tap that follows.
    for (const kind of kinds) el.addEventListener(kind, block, { capture: true, passive: false })
  })
  onBeforeUnmount(() => {
    const el = root?.value
    if (el) for (const kind of kinds) el.removeEventListener(kind, block, { capture: true })
  })

  return { ready: readonly(ready), lock }
}
