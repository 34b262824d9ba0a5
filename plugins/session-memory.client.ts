import { STORAGE_KEY_SESSION } from '~/constants'

// Offline, the session route cannot answer, so nuxt-auth-utils would see nobody signed in and
// every screen would bounce to sign-in. The tablet remembers the last signed-in person and uses
// that copy only when the server could not be asked (an empty answer from a reachable server
// means signed out, and is respected). The server still checks the real cookie on every sync.
export default defineNuxtPlugin(() => {
  const session = useState<Record<string, any> | null>('nuxt-session')
  const offlineSession = useState('jogwise-offline-session', () => false)
  if (session.value === null) {
    const remembered = localStorage.getItem(STORAGE_KEY_SESSION)
    if (remembered) {
      try {
        session.value = JSON.parse(remembered)
        offlineSession.value = true
      }
      catch { localStorage.removeItem(STORAGE_KEY_SESSION) }
    }
  }
  watch(session, (value) => {
    if (value?.user) localStorage.setItem(STORAGE_KEY_SESSION, JSON.stringify({ user: value.user, loggedInAt: value.loggedInAt }))
    else if (value) localStorage.removeItem(STORAGE_KEY_SESSION)
  }, { immediate: true, deep: true })
})
