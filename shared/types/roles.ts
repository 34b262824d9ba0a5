export const ROLES = ['owner', 'trainer', 'operator', 'trainee'] as const
export type Role = typeof ROLES[number]

/** Roles allowed to write and version procedures, override holds and sign off trainees. */
export const LEAD_ROLES: readonly Role[] = ['owner', 'trainer']

/**
 * Guided or solo: trainees always run guided; an operator runs solo only where the owner has
 * qualified them for that procedure; trainers and owners supervise and run solo.
 */
export function runModeFor(role: Role, qualified: boolean): 'guided' | 'solo' {
  if (role === 'trainee') return 'guided'
  if (role === 'operator') return qualified ? 'solo' : 'guided'
  return 'solo'
}

/** Does this role lead (write procedures, override holds, sign off, read the Ledger)? */
export const isLeadRole = (role: string | null | undefined): role is 'owner' | 'trainer' =>
  role === 'owner' || role === 'trainer'
