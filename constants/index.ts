import type { Role } from '#shared/types/roles'

/** Storage and cookie keys, all prefixed with the app's name. */
export const STORAGE_KEY_THEME = 'jogwise-theme'
export const STORAGE_KEY_DEVICE = 'jogwise-device-id'
export const STORAGE_KEY_SESSION = 'jogwise-session'

/** Fetch keys of server data, invalidated with refreshNuxtData(key) after a change. */
export const QUERY_KEYS = {
  machines: 'machines',
  crew: 'crew',
  me: 'me',
} as const

export interface NavItem { to: string, label: string, icon: string, roles: readonly Role[] }

/** Screens in the app's rail; only screens that exist are listed. */
export const NAV_ITEMS: NavItem[] = [
  { to: '/', label: 'Floor', icon: 'floor', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/library', label: 'Library', icon: 'library', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/planner', label: 'Planner', icon: 'planner', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/board', label: 'Board', icon: 'board', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/feeds', label: 'Feeds', icon: 'feeds', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/cutters', label: 'Cutters', icon: 'cutter', roles: ['owner', 'trainer', 'operator', 'trainee'] },
  { to: '/machines', label: 'Machines', icon: 'machine', roles: ['owner'] },
  { to: '/crew', label: 'Crew', icon: 'crew', roles: ['owner', 'trainer'] },
  { to: '/ledger', label: 'Ledger', icon: 'ledger', roles: ['owner', 'trainer'] },
  { to: '/due', label: 'Due', icon: 'due', roles: ['owner', 'trainer', 'operator', 'trainee'] },
]

export const SAFETY_NOTE = 'Jogwise supplements, and never replaces, the machine maker\'s manual, local codes and competent practice. Stop and ask when in doubt.'
