import type { ServerResponse } from 'node:http'

// The session cookie is HttpOnly, SameSite=Lax and Secure (nuxt.config.ts runtimeConfig.session;
// Secure is h3's default). A shop may serve Jogwise over plain http on its own network, where a
// browser drops every Secure cookie (localhost aside), so nobody could stay signed in. So over
// plain http, and only there, Secure is taken off the cookies of that one answer. Behind an
// HTTPS reverse proxy set NUXT_TRUST_PROXY=1 so its X-Forwarded-Proto counts (request-origin.ts).
// Deciding per answer keeps it right for every route that writes a session, today's and later.
function withoutSecure(value: unknown): any {
  if (Array.isArray(value)) return value.map(withoutSecure)
  return typeof value === 'string' ? value.replace(/;\s*Secure(?=;|$)/gi, '') : value
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    if (requestIsHttps(event)) return
    const res = event.node.res as ServerResponse
    const setHeader = res.setHeader.bind(res)
    res.setHeader = ((name: string, value: any) => setHeader(name, name.toLowerCase() === 'set-cookie' ? withoutSecure(value) : value)) as typeof res.setHeader
    if (typeof res.appendHeader === 'function') {
      const appendHeader = res.appendHeader.bind(res)
      res.appendHeader = ((name: string, value: any) => appendHeader(name, name.toLowerCase() === 'set-cookie' ? withoutSecure(value) : value)) as typeof res.appendHeader
    }
  })
})
