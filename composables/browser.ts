// The few browser facts the Run screen and its top bar watch, as refs. Written out rather than
// taken from VueUse so that no part of VueUse loads with every screen (issue 14); other screens
// use VueUse freely. Each is safe on the server (it answers a fixed value there).

let networkUp: Ref<boolean> | undefined

/**
 * Whether the browser has a network at all (navigator.onLine and its online/offline events), one
 * ref for the whole app. It says nothing about whether the server answers; the sync store does.
 */
export function useNetworkUp(): Readonly<Ref<boolean>> {
  if (import.meta.server) return ref(true)
  if (!networkUp) {
    const up = ref(navigator.onLine)
    window.addEventListener('online', () => { up.value = true })
    window.addEventListener('offline', () => { up.value = false })
    networkUp = up
  }
  return networkUp
}

/** The time now, moved on every `intervalMs` while the component (or scope) that asked lives. */
export function useClock(intervalMs: number): Readonly<Ref<Date>> {
  const now = shallowRef(new Date())
  if (import.meta.client) {
    const timer = setInterval(() => { now.value = new Date() }, intervalMs)
    onScopeDispose(() => clearInterval(timer))
  }
  return now
}

/** Whether a media query matches (orientation, width…), kept current while the scope lives. */
export function useMediaMatch(query: string): Readonly<Ref<boolean>> {
  const matches = ref(false)
  if (import.meta.client) {
    const list = window.matchMedia(query)
    matches.value = list.matches
    const changed = (e: MediaQueryListEvent) => { matches.value = e.matches }
    list.addEventListener('change', changed)
    onScopeDispose(() => list.removeEventListener('change', changed))
  }
  return matches
}

/** Calls `fn` whenever the element in `target` changes size (and once it is there). */
export function useSizeChange(target: Ref<HTMLElement | undefined>, fn: () => void) {
  if (import.meta.server || typeof ResizeObserver === 'undefined') return
  const observer = new ResizeObserver(() => fn())
  watch(target, (el, old) => {
    if (old) observer.unobserve(old)
    if (el) observer.observe(el)
  }, { immediate: true, flush: 'post' })
  onScopeDispose(() => observer.disconnect())
}
