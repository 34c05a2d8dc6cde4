import type { PersonStatus } from '#shared/types/people'

/** How each account status is named in the people list. */
export const PERSON_STATUS_LABELS: Record<PersonStatus, string> = {
  'active': 'Active',
  'invited': 'Invited',
  'invitation-expired': 'Invitation expired',
  'deactivated': 'Deactivated',
}
