// Nitro's runtime folder is aliased at build time, so `nitropack/runtime/internal` resolves to
// its index there; the package's export map has no types for that folder, so name them here.
declare module 'nitropack/runtime/internal' {
  export * from 'nitropack/dist/runtime/internal/index'
}
