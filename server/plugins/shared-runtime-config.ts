// Nitro gives each request its own copy of the runtime config (a deep clone with every NUXT_*
// variable applied again) the first time something asks for it with the event, and the i18n
// module asks on every request: about a millisecond each (issue 14). Jogwise never changes the
// config per request, so every request reads the process's own copy, which Nitro has frozen:
// a write to it would fail loudly rather than leak into other requests.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    event.context.nitro ??= { errors: [] }
    event.context.nitro.runtimeConfig ??= useRuntimeConfig()
  })
})
