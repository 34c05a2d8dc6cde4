import type { PersonStatus } from '#shared/types/people'
import type { UnitSystem } from '#shared/vocabulary'

/** How each account status is named in the people list. */
export const PERSON_STATUS_LABELS: Record<PersonStatus, string> = {
  'active': 'Active',
  'invited': 'Invited',
  'invitation-expired': 'Invitation expired',
  'deactivated': 'Deactivated',
}

/** How each unit system is offered: what it means on screen, in the reader's words. */
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = {
  us: 'US (gallons, inches, °F)',
  metric: 'Metric (litres, cm, °C)',
}
