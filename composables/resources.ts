// One composable per server resource the screens read, each with its fetch key written once.
// A key names one copy of the data for every screen that shows it; after a save, `forget…`
// drops the copies it made stale and each screen reads afresh when it opens (never
// `await refreshNuxtData()`: it first waits for the browser to be idle).

export const RESOURCE_KEYS = {
  machines: 'machines',
  machinesAll: 'machines-all',
  procedures: 'procedures',
  procedure: (id: string | number) => `procedure-${id}`,
  tools: 'tools',
  me: 'me',
  crew: 'crew',
  qualifications: 'qualifications',
  signers: 'signers',
  due: 'due',
  intervals: 'intervals',
  activeRuns: 'runs-active',
} as const

/** The shop's machines in service. */
export const useMachines = () => useFetch('/api/machines', { key: RESOURCE_KEYS.machines, default: () => [] })
/** The same list with retired machines, for the owner's Machines screen and the Ledger filters. */
export const useAllMachines = () => useFetch('/api/machines', { key: RESOURCE_KEYS.machinesAll, query: { retired: 'include' }, default: () => [] })
/** Machines read offline from the service worker's copy, which says how old it is. */
export const useSavedMachines = () => useCachedFetch('/api/machines', { key: RESOURCE_KEYS.machines, default: () => [] })
export const forgetMachines = () => clearNuxtData([RESOURCE_KEYS.machines, RESOURCE_KEYS.machinesAll])

/** The Library: every procedure with its current version. */
export const useProcedures = () => useFetch('/api/procedures', { key: RESOURCE_KEYS.procedures, default: () => [] })
export const useSavedProcedures = () => useCachedFetch('/api/procedures', { key: RESOURCE_KEYS.procedures, default: () => [] })
/** One procedure with its versions. */
export const useProcedure = (id: string | number) => useFetch(`/api/procedures/${id}`, { key: RESOURCE_KEYS.procedure(id) })
export const forgetProcedures = (id?: string | number) =>
  clearNuxtData(id === undefined ? [RESOURCE_KEYS.procedures] : [RESOURCE_KEYS.procedures, RESOURCE_KEYS.procedure(id)])

export const useTools = () => useFetch('/api/tools', { key: RESOURCE_KEYS.tools, default: () => [] })
/** The signed-in person with their preferences (units). */
export const useMe = () => useFetch('/api/me', { key: RESOURCE_KEYS.me })
/** The shop's people (owner and trainer). */
export const useCrew = () => useFetch('/api/users', { key: RESOURCE_KEYS.crew, default: () => [] })
export const useQualifications = () => useFetch('/api/qualifications', { key: RESOURCE_KEYS.qualifications, default: () => [] })
/** Who may sign a trainee's run on this tablet. */
export const useSigners = () => useFetch('/api/signers', { key: RESOURCE_KEYS.signers, default: () => [] })
export const useDue = () => useFetch('/api/due', { key: RESOURCE_KEYS.due, default: () => [] })
export const useIntervals = () => useFetch('/api/maintenance-intervals', { key: RESOURCE_KEYS.intervals, default: () => [] })
export const useActiveRuns = () => useFetch('/api/runs', { key: RESOURCE_KEYS.activeRuns, query: { status: 'active' }, default: () => [] })
