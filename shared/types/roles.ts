export const ROLES = ['owner', 'trainer', 'operator', 'trainee'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  owner: 'Owner',
  trainer: 'Trainer',
  operator: 'Operator',
  trainee: 'Trainee',
}

/** Roles allowed to write and version procedures, override holds and sign off trainees. */
export const LEAD_ROLES: readonly Role[] = ['owner', 'trainer']
