// Nuxt-environment test setup: the app keeps its offline queue in IndexedDB, which happy-dom
// lacks, so the tests use an in-memory IndexedDB that behaves like the browser's.
import 'fake-indexeddb/auto'
