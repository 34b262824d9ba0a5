// Compiled in by nuxt.config.ts (nitro hook rollup:before) from server/build/csp-hashes.ts.
declare module '#jogwise-csp-hashes' {
  const hashes: string[]
  export default hashes
}
