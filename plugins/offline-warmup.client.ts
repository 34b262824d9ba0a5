// Reads the shop's machines, library, qualifications and open runs once the app runs online, so
// the service worker holds a copy and a run can be started or resumed with no network later.
// Pages rendered on the server never pass their reads through the service worker, hence this.
const OFFLINE_READS = ['/api/me', '/api/machines', '/api/procedures', '/api/qualifications', '/api/signers', '/api/tools', '/api/runs?status=active', '/api/signoff-key', '/api/due',
  // The shop's id and paper size: Scan a machine tag and printed sheets offline (issue 17).
  '/api/shop']

export default defineNuxtPlugin((nuxtApp) => {
  const { loggedIn } = useUserSession()
  const online = useNetworkUp()
  async function warm() {
    if (!loggedIn.value || !online.value || !navigator.serviceWorker?.controller) return
    await Promise.allSettled(OFFLINE_READS.map(url => fetch(url, { headers: { accept: 'application/json' } })))
  }
  nuxtApp.hook('app:mounted', () => {
    navigator.serviceWorker?.ready.then(() => setTimeout(warm, 500))
    watch([loggedIn, online], warm)
    navigator.serviceWorker?.addEventListener('controllerchange', warm)
  })
})
