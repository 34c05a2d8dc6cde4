import type { AlertStatus } from '#shared/vocabulary'
import type { PersonStatus } from '#shared/types/people'
import type { TankStatus } from '#shared/types/tanks'

/** The small mark a `<StatusPill>` draws before its words (WCAG 1.4.1: never colour alone). */
export type StatusShape = 'ring' | 'half' | 'square' | 'diamond' | 'check' | 'dot' | 'triangle' | 'cross' | 'dash'

export interface StatusLook {
  /** Tailwind classes: tint, text colour and, for some, a ring; every text colour 4.5:1 on its tint. */
  tone: string
  shape: StatusShape
}

/** Each tank status its own tint and shape: signed off and stocking used to be one identical green pill. */
export const TANK_STATUS_LOOKS: Record<TankStatus, StatusLook> = {
  'planned': { tone: 'bg-sand-100 text-ink-soft', shape: 'ring' },
  'building': { tone: 'bg-sand-200 text-ink', shape: 'square' },
  'cycling': { tone: 'bg-tide-50 text-tide-700', shape: 'half' },
  'cycled': { tone: 'bg-amber-50 text-signal-caution ring-1 ring-inset ring-signal-caution', shape: 'diamond' },
  'signed-off': { tone: 'bg-green-50 text-signal-safe ring-1 ring-inset ring-signal-safe', shape: 'check' },
  'stocking': { tone: 'bg-signal-safe text-white', shape: 'dot' },
}

export const PERSON_STATUS_LOOKS: Record<PersonStatus, StatusLook> = {
  'active': { tone: 'bg-green-50 text-signal-safe', shape: 'check' },
  'invited': { tone: 'bg-tide-50 text-tide-700', shape: 'ring' },
  'invitation-expired': { tone: 'bg-amber-50 text-signal-caution ring-1 ring-inset ring-signal-caution', shape: 'cross' },
  'deactivated': { tone: 'bg-sand-200 text-ink-soft', shape: 'dash' },
}

/** Open and acknowledged never rest on red against amber alone. */
export const ALERT_STATUS_LOOKS: Record<AlertStatus, StatusLook & { label: string }> = {
  open: { label: 'Open', tone: 'bg-signal-danger text-white', shape: 'triangle' },
  acknowledged: { label: 'Acknowledged', tone: 'bg-signal-caution text-white', shape: 'half' },
  resolved: { label: 'Resolved', tone: 'bg-green-50 text-signal-safe ring-1 ring-inset ring-signal-safe', shape: 'check' },
}
