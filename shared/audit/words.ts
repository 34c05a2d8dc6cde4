import { THRESHOLD_SPECS } from '../cycle/thresholds'

/**
 * The audit trail in plain words: what each recorded action means, and a before/after
 * list of the fields that changed, with names people read rather than column names.
 * Pure, so the viewer, the CSV export and the tests share it.
 */

/** Each action the server records, as a reader would say it. Unknown actions fall back to their code. */
export const AUDIT_ACTION_LABELS: Readonly<Record<string, string>> = Object.freeze({
  'tank.create': 'Created the tank',
  'tank.update': 'Changed the tank',
  'tank.status': 'Moved the tank to another status',
  'tank.kit-basis': 'Changed how the test kit reads',
  'tank.start-stocking': 'Started stocking',
  'reading.create': 'Entered a test',
  'reading.update': 'Edited a test',
  'reading.delete': 'Deleted a test',
  'reading.correct': 'Corrected a signed test',
  'reading.import': 'Imported tests from a file',
  'event.create': 'Recorded an event',
  'event.update': 'Edited an event',
  'event.delete': 'Deleted an event',
  'event.correct': 'Corrected a signed event',
  'plan-stage.update': 'Updated a build stage',
  'plan-template.replace': 'Changed the build-plan template',
  'upload.create': 'Added a photo or file',
  'upload.delete': 'Removed a photo or file',
  'upload.expire': 'Removed a test photo never attached to a test',
  'alert.open': 'Alert opened',
  'alert.acknowledge': 'Acknowledged an alert',
  'alert.resolve': 'Resolved an alert',
  'sign-off.request': 'Asked for sign-off',
  'sign-off.approve': 'Signed the cycle off',
  'sign-off.approve-override': 'Signed the cycle off against the verdict',
  'sign-off.return': 'Returned the tank for more work',
  'sign-off.reopen': 'Reopened a sign-off',
  'sign-off.amend': 'Amended a signed record',
  'client.create': 'Added a client',
  'client.update': 'Changed a client',
  'client.archive': 'Archived a client',
  'client.restore': 'Restored a client',
  'site.create': 'Added a site',
  'site.update': 'Changed a site',
  'site.archive': 'Archived a site',
  'site.restore': 'Restored a site',
  'user.invite': 'Invited someone',
  'user.invite-resend': 'Sent an invitation again',
  'user.invite-withdraw': 'Withdrew an invitation',
  'user.invite-accepted': 'Accepted an invitation',
  'user.invite-existing': 'Invited an address that already has an account',
  'user.role-change': 'Changed a role',
  'user.deactivate': 'Deactivated an account',
  'user.reactivate': 'Reactivated an account',
  'user.reset-sent': 'Sent a password-reset link',
  'user.reset-requested': 'Asked for a password reset',
  'user.password-reset': 'Chose a new password',
  'preferences.update': 'Changed notice preferences',
  'preferences.units': 'Changed their units',
  'preferences.salinity-instrument': 'Changed how they measure a tank\'s salinity',
  'organisation.settings': 'Changed the company settings',
})

/** The plain-words name of an action code. */
export function auditActionLabel(action: string): string {
  return AUDIT_ACTION_LABELS[action] ?? action
}

/** The first part of each action code, for the viewer's action filter. */
export const AUDIT_ACTION_GROUPS: Readonly<Record<string, string>> = Object.freeze({
  'tank': 'Tanks',
  'reading': 'Tests',
  'event': 'Events',
  'plan-stage': 'Build stages',
  'plan-template': 'Plan template',
  'upload': 'Photos and files',
  'alert': 'Alerts',
  'sign-off': 'Sign-off',
  'client': 'Clients',
  'site': 'Sites',
  'user': 'People',
  'preferences': 'Preferences',
  'organisation': 'Company settings',
})

/** Keys that say nothing to a reader (ids, bookkeeping times, what was typed beside the canonical value). */
const QUIET_KEYS = new Set(['id', 'organisationId', 'createdAt', 'updatedAt', 'entered', 'importKey', 'passwordHash', 'tankId', 'enteredBy'])

/** Field names people read; others are split from camelCase. */
const FIELD_LABELS: Readonly<Record<string, string>> = Object.freeze({
  takenAt: 'taken at',
  ammoniaN: 'total ammonia (mg/L as N)',
  nitriteN: 'nitrite (mg/L as N)',
  nitrateN: 'nitrate (mg/L as N)',
  pH: 'pH',
  temperatureC: 'temperature (°C)',
  salinity: 'salinity (practical)',
  alkalinityDkh: 'alkalinity (dKH)',
  calciumMgL: 'calcium (mg/L)',
  magnesiumMgL: 'magnesium (mg/L)',
  phosphateMgL: 'phosphate (mg/L)',
  volumeLitres: 'volume (L)',
  sumpLitres: 'sump (L)',
  aquaristId: 'aquarist',
  supervisorId: 'supervisor',
  clientId: 'client',
  siteId: 'site',
  escalationMinutes: 'escalation delay (minutes)',
  graceMinutes: 'grace (minutes)',
  missedDays: 'missed days before the aquarist is told',
  requesterMayApprove: 'requester may approve',
  timeZone: 'time zone',
  defaultUnits: 'default units',
  signOff: 'sign-off',
})

const words = (key: string) => key.replace(/([a-z0-9])([A-Z])/g, '$1 $2').replace(/[_-]/g, ' ').toLowerCase()

function fieldLabel(key: string): string {
  return FIELD_LABELS[key] ?? words(key)
}

/** An engine limit by what it does and its unit, from THRESHOLD_SPECS. */
function thresholdLabel(key: string): string {
  if (!Object.hasOwn(THRESHOLD_SPECS, key)) return words(key)
  const spec = THRESHOLD_SPECS[key as keyof typeof THRESHOLD_SPECS]
  return `${spec.description.replace(/\.$/, '')} (${spec.unit})`
}

/** A dotted path in words; a threshold reads as its description. */
function pathLabel(field: string): string {
  const parts = field.split('.').filter(part => part !== 'settings')
  if (parts.length === 2 && parts[0] === 'thresholds') return `limit: ${thresholdLabel(parts[1]!)}`
  return parts.map(fieldLabel).join(': ')
}

/** One value as a reader sees it: numbers to at most three decimals, yes/no, dash for nothing. */
export function auditValueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return '—'
  if (typeof value === 'boolean') return value ? 'yes' : 'no'
  if (typeof value === 'number') return Number.isFinite(value) ? String(Math.round(value * 1000) / 1000) : String(value)
  if (typeof value === 'string') return value
  return JSON.stringify(value)
}

export interface AuditChange {
  /** Dotted path of the changed value, e.g. `settings.reminders.graceMinutes`. */
  field: string
  /** The same path in words, e.g. `reminders: grace (minutes)`. */
  label: string
  before: string
  after: string
}

const isPlainObject = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value)

/** Leaf values of a nested object by dotted path; arrays and scalars are leaves. */
function flatten(value: unknown, prefix = '', out = new Map<string, unknown>()): Map<string, unknown> {
  if (!isPlainObject(value)) {
    if (prefix) out.set(prefix, value)
    return out
  }
  for (const [key, inner] of Object.entries(value)) {
    if (QUIET_KEYS.has(key)) continue
    flatten(inner, prefix ? `${prefix}.${key}` : key, out)
  }
  return out
}

/**
 * The fields that differ between a row's before and after, in plain words. A creation
 * (no before) lists what was set; a deletion (no after) what was there.
 */
export function auditChanges(before: unknown, after: unknown): AuditChange[] {
  const b = flatten(before)
  const a = flatten(after)
  const fields = [...new Set([...b.keys(), ...a.keys()])]
  const changes: AuditChange[] = []
  for (const field of fields) {
    const was = auditValueText(b.get(field))
    const now = auditValueText(a.get(field))
    if (was === now) continue
    changes.push({ field, label: pathLabel(field), before: was, after: now })
  }
  return changes
}
