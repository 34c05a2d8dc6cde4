/**
 * The kinds of notice Tidewright sends, and which of them a user may keep out of their
 * e-mail. Every notice also appears in the app's notification centre, except the weekly
 * digest, which is e-mail only (it repeats what the tank page shows).
 */

export type NoticeKind = 'alert-opened' | 'alert-escalated' | 'alert-resolved' | 'tank-danger' | 'test-reminder' | 'tests-missed' | 'weekly-digest'

export interface NoticeKindInfo {
  kind: NoticeKind
  label: string
  description: string
}

/** In the order the preferences page lists them. */
export const NOTICE_KINDS: readonly NoticeKindInfo[] = [
  { kind: 'alert-opened', label: 'Danger alerts', description: 'A test on one of your tanks crossed a danger threshold.' },
  { kind: 'alert-escalated', label: 'Escalated alerts', description: 'An alert on a tank you supervise was not acknowledged in time.' },
  { kind: 'tank-danger', label: 'Danger on my tank', description: 'A test on your own tank shows a danger to the animals, with what to do.' },
  { kind: 'alert-resolved', label: 'Alerts cleared', description: 'A later test cleared an alert.' },
  { kind: 'test-reminder', label: 'Test reminders', description: 'Today\'s water test has not been entered by the usual time.' },
  { kind: 'tests-missed', label: 'Missed tests', description: 'A client has missed several days of tests.' },
  { kind: 'weekly-digest', label: 'Weekly summary', description: 'Monday mornings while a tank is cycling: where it stands and when it is likely to be ready (a forecast, never a promise).' },
]

/** E-mail for a kind, given the user's stored choices: on unless switched off. */
export function wantsEmail(choices: Readonly<Record<string, boolean>> | undefined, kind: NoticeKind): boolean {
  return choices?.[kind] !== false
}

/** Danger alerts to the tank's assigned aquarist always go by e-mail; no preference can stop them. */
export function emailIsMandatory(kind: NoticeKind, recipientIsAssignedAquarist: boolean): boolean {
  return kind === 'alert-opened' && recipientIsAssignedAquarist
}
