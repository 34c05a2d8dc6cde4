/**
 * Who may change a reading or an event, written once. Every edit and delete of a
 * reading or event goes through assertEditable, so later rules (a signed-off period
 * locks its readings) are added here and apply everywhere.
 */
import type { Actor } from './access'
import { canManageTank } from './access'
import { assertEntryUnlocked, lockedUntil } from './sign-off-lock'

/** A client may fix their own entries for this long after entering them. */
export const CLIENT_EDIT_WINDOW_MS = 24 * 3_600_000

/** Roles that may enter readings and events: staff who manage tanks, and the tank's client. */
export const ENTRY_ROLES = ['admin', 'aquarist', 'client'] as const

export interface EditableEntry {
  /** The entry's id: an entry held in the sign-off snapshot stays locked whatever its date. */
  id?: string
  enteredBy: string | null
  createdAt: string
  /** The reading's takenAt or the event's at: what a period lock will compare. */
  at: string
}

/**
 * Why the actor may not change the entry now, or null if they may. `locked` is the end of
 * the signed-off period (lockedUntil), passed in so a list asks the database once.
 */
export function editRefusal(actor: Actor, tank: { id: string, organisationId: string }, entry: EditableEntry, now = new Date(), locked: string | null = null): string | null {
  if (locked && Date.parse(entry.at) <= Date.parse(locked)) return 'This entry is in the signed-off period; add a correction with a reason instead.'
  if (actor.role === 'client') {
    if (entry.enteredBy !== actor.id) return 'You can change only the entries you made. Ask your aquarist to correct this one.'
    if (now.getTime() - Date.parse(entry.createdAt) > CLIENT_EDIT_WINDOW_MS) return 'Entries can be fixed for 24 hours. Ask your aquarist to correct this one.'
    return null
  }
  if (!canManageTank(actor, tank)) return 'Your role may not change entries.'
  return null
}

/**
 * Throws 403 unless the actor may edit or delete this reading or event now, and 409 when
 * the entry lies in a signed-off period (server/utils/sign-off-lock.ts). An edit that moves the entry to another time also
 * calls assertWritableAt with the new time.
 */
export function assertEditable(actor: Actor, tank: { id: string, organisationId: string }, entry: EditableEntry, now = new Date()): void {
  const refusal = editRefusal(actor, tank, entry, now)
  if (refusal) throw createError({ statusCode: 403, statusMessage: refusal })
  assertEntryUnlocked(tank.id, entry.at, entry.id)
}

/** A new or moved entry may not be written into a signed-off period (409). */
export function assertWritableAt(tankId: string, at: string): void {
  assertEntryUnlocked(tankId, at)
}

/** The end of the tank's signed-off period, or null. */
export function tankLockedUntil(tankId: string): string | null {
  return lockedUntil(tankId)
}
