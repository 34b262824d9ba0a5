import { dirname, relative } from 'node:path'
import { addVitePlugin, defineNuxtModule } from '@nuxt/kit'

// Script chunks of the client build (issue 14). Left alone, the bundler gives each set of
// modules that a different set of screens shares a chunk of its own: the Run screen fetched some
// twenty scripts under 1 KB each, every one with its own gzip header and import/export lines.
// Here the small modules the Run screen shares with other screens go into four chunks instead,
// each of what a group of screens loads anyway (so no screen loads much it does not use):
// - `shell`: the default layout (top bar, rail, sync chip) and what nearly every screen under it
//   uses: icons, formatting, error text, roles, units, input rules and ids;
// - `procedure`: a procedure's text rules, as the Library and the run screens both show them;
// - `fold`: the run fold, for the Floor, the planner and the run screens;
// - `run`: the run composable and the run screens' tap guard.
// Only modules listed here move (output.onlyExplicitManualChunks: their dependencies are not
// pulled in with them), so no screen's own large code (charts, planner, editor, heat map, zod
// schemas) can reach the Run screen through these chunks. A module not listed keeps the
// bundler's choice.
const CHUNKS: Record<string, RegExp[]> = {
  shell: [
    /^layouts\/default\.vue$/,
    /^components\/layout\/The(TopBar|AppRail)\.vue$/,
    /^components\/sync\/SyncStatusChip\.client\.vue$/,
    /^components\/ui\/UiIcon\.vue$/,
    /^composables\/(format|error-text)\.ts$/,
    /^utils\/date-text\.ts$/,
    /^shared\/i18n\/translate\.ts$/,
    /^shared\/types\/roles\.ts$/,
    /^shared\/rules\/(language|input)\.ts$/,
    /^shared\/machining\/units\.ts$/,
    /^node_modules\/uuid\//,
  ],
  procedure: [
    /^components\/library\/HoldPanel\.vue$/,
    /^composables\/range-text\.ts$/,
    /^shared\/procedures\/(text|range|localize|signal-words)\.ts$/,
  ],
  fold: [
    /^shared\/runs\/(fold|undo|event-kinds)\.ts$/,
    /^shared\/rules\/(order|json)\.ts$/,
  ],
  run: [
    /^shared\/runs\/(next-action|event-quick)\.ts$/,
    /^composables\/(run|tap-guard)\.ts$/,
    /^components\/safety\/SafetySupplementNote\.vue$/,
  ],
}

const ROOT = dirname(import.meta.dirname)

/** The chunk a module is listed for, by its path inside the repository. */
function listedChunk(id: string) {
  // Without Vite's query: a .vue file's parts ('?vue&type=script…') go with it.
  const path = relative(ROOT, id.replace(/\?.*$/, ''))
  for (const [name, patterns] of Object.entries(CHUNKS)) {
    if (patterns.some(p => p.test(path))) return name
  }
  return null
}

/** What the bundler tells a chunk-naming function about the module graph. */
interface ModuleGraph {
  getModuleIds: () => Iterable<string>
  getModuleInfo: (id: string) => { isEntry: boolean, importedIds: readonly string[] } | null
}

/** The given modules and every module they import statically, however deep. */
function withImports(ids: Iterable<string>, { getModuleInfo }: ModuleGraph, skip?: RegExp) {
  const seen = new Set<string>()
  const queue = [...ids]
  for (const id of queue) {
    if (seen.has(id) || skip?.test(id)) continue
    seen.add(id)
    queue.push(...getModuleInfo(id)?.importedIds ?? [])
  }
  return seen
}

/**
 * Rollup treats each listed chunk as an entry point of its own, so what a listed chunk imports
 * from the entry chunk (Vue, Nuxt, the stores) would be split off the entry into a chunk that
 * both import. Naming all the entry's own modules for one chunk keeps them together. Not through
 * Nuxt's components index: it re-exports every Nuxt component, NuxtLink too, while the entry
 * imports the few it uses from their own files.
 */
const NUXT_COMPONENTS_INDEX = /[\\/]node_modules[\\/]nuxt[\\/]dist[\\/]app[\\/]components[\\/]index\.js$/

/**
 * Nuxt's useAsyncData and useFetch modules make their composables with top-level factory calls
 * the bundler cannot prove pure, so every screen's entry kept them (with their key hashing),
 * used or not. They have no side effects of their own: marked so, and not named for the entry,
 * they load with the screens that read through them, not with the Run screen, which reads
 * through its own store.
 */
const PURE_NUXT_MODULES = /[\\/]node_modules[\\/]nuxt[\\/]dist[\\/]app[\\/]composables[\\/](asyncData|fetch)\.js$/
/** What only those two use on a screen (their key hashing and debounced refresh). */
const USED_WITH_PURE_NUXT_MODULES = /[\\/]node_modules[\\/](ohash|perfect-debounce)[\\/]/
const NOT_NAMED_FOR_ENTRY = new RegExp([NUXT_COMPONENTS_INDEX, PURE_NUXT_MODULES, USED_WITH_PURE_NUXT_MODULES].map(r => r.source).join('|'))

let inEntry: Set<string> | undefined

function manualChunks(id: string, meta: ModuleGraph) {
  inEntry ??= withImports([...meta.getModuleIds()].filter(id => meta.getModuleInfo(id)?.isEntry), meta, NOT_NAMED_FOR_ENTRY)
  return inEntry.has(id) ? 'entry' : listedChunk(id)
}

export default defineNuxtModule({
  meta: { name: 'jogwise-client-chunks' },
  setup(_options, nuxt) {
    // The development server serves modules one by one; chunks are a production build's matter.
    if (nuxt.options.dev) return
    addVitePlugin({
      name: 'jogwise-client-chunks',
      apply: 'build',
      // The browser's build only; the server's bundle is not fetched by anyone.
      config(_config, env) {
        if (env.isSsrBuild) return
        inEntry = undefined
        // Rollup's output options: Nuxt builds with its own Vite 7 and Rollup, while the types
        // seen here are those of the newer Vite at the project's top level.
        const output = { manualChunks, onlyExplicitManualChunks: true }
        return { build: { rollupOptions: { output: output as never } } }
      },
      transform(code, id) {
        if (PURE_NUXT_MODULES.test(id)) return { code, map: null, moduleSideEffects: false }
      },
    })
  },
})
