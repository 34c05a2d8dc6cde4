import type { Role } from '#shared/types/roles'

/** Whether a page limited to `roles` (none named: open to every signed-in person) lets `role` in. */
export function allowsRole(roles: readonly Role[] | undefined, role: Role | undefined): boolean {
  if (!roles) return true
  return role !== undefined && roles.includes(role)
}
