export const ROLES = ['manager', 'host', 'marketing', 'guest'] as const
export type Role = (typeof ROLES)[number]
export const STAFF_ROLES = ['manager', 'host', 'marketing'] as const
export type StaffRole = (typeof STAFF_ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  manager: 'Manager',
  host: 'Host',
  marketing: 'Marketing',
  guest: 'Guest',
}
