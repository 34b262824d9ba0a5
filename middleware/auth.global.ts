// Every screen but sign-in needs a signed-in person.
export default defineNuxtRouteMiddleware(async (to) => {
  const { loggedIn } = useUserSession()
  if (to.path === '/login') {
    // ?reauth: the server ended the session while the tablet still shows the person; the
    // queue waits until they sign in again.
    if (loggedIn.value && !to.query.reauth) return navigateTo('/')
    return
  }
  // An invite link is opened by someone who has no sign-in yet.
  if (to.path.startsWith('/join/')) return
  if (!loggedIn.value) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : undefined })
  const need = to.meta.roles as string[] | undefined
  const { user } = useUserSession()
  if (need && user.value && !need.includes(user.value.role)) return navigateTo('/')
})
