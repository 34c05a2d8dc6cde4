import { ROLES, STAFF_ROLES, type Role } from '#shared/vocabulary'

export interface NavLink {
  to: string
  label: string
  roles: readonly Role[]
}

const EVERYONE: readonly Role[] = ROLES
const STAFF: readonly Role[] = STAFF_ROLES

/** The main navigation, one line per destination; each feature adds its own line. */
export const NAV_LINKS: readonly NavLink[] = [
  { to: '/', label: 'Today', roles: EVERYONE },
  { to: '/tanks', label: 'Tanks', roles: STAFF },
  { to: '/clients', label: 'Clients', roles: STAFF },
  { to: '/plan-template', label: 'Plan template', roles: ['admin'] },
  { to: '/reviews', label: 'Reviews', roles: ['admin', 'supervisor'] },
  { to: '/alerts', label: 'Alerts', roles: STAFF },
  { to: '/people', label: 'People', roles: ['admin', 'aquarist'] },
  { to: '/audit', label: 'Audit trail', roles: ['supervisor'] },
  { to: '/admin/mail', label: 'Outgoing mail', roles: ['admin'] },
  { to: '/admin', label: 'Company', roles: ['admin'] },
]

/** The links a role sees, with the client's wording for their own tanks. */
export function navLinksFor(role: Role | undefined): NavLink[] {
  if (!role) return []
  return NAV_LINKS.filter(link => link.roles.includes(role))
    .map(link => (link.to === '/' && role === 'client' ? { ...link, label: 'My tanks' } : link))
}
