import type { Role } from '#shared/types/roles'

/** How each role is named in the interface. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  aquarist: 'Aquarist',
  supervisor: 'Supervisor',
  client: 'Client',
}
