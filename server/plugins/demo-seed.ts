// Seeds the invented demo shop at start-up when NUXT_DEMO_SEED is set and the database is
// empty. It runs inside the server so passwords are hashed with nuxt-auth-utils' own helper.
export default defineNitroPlugin(() => {
  const config = useRuntimeConfig()
  if (!config.demoSeed) return
  seedDemoShopIfEmpty(config.demoPassword)
    .then(seeded => seeded && console.info('[jogwise] demo shop seeded'))
    .catch(error => console.error('[jogwise] demo seed failed:', error instanceof Error ? error.message : error))
})
