// Nuxt-environment test setup
