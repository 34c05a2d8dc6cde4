/**
 * Writes a notice for one user: always a row in the notification centre, and an e-mail
 * in the outbox when the user's preferences (or the rule for danger alerts) say so.
 * Framework-free; called inside the caller's transaction so the notice commits with
 * the change that caused it.
 */
import { eq } from 'drizzle-orm'
import { emailIsMandatory, wantsEmail, type NoticeKind } from '../../shared/notifications/kinds'
import type { Db } from './connection'
import { enqueueMail } from './outbox'
import { notificationPreferences, notifications, users } from './schema'

type Tx = Db

export interface Notice {
  /** A stable id makes the notice idempotent: a second write with it adds nothing. */
  id?: string
  userId: string
  organisationId: string
  kind: NoticeKind
  title: string
  body: string
  link?: string | null
  alertId?: string | null
  email?: { subject: string, text: string, html?: string, messageId?: string }
  /** True when the recipient is the tank's assigned aquarist (danger alerts cannot be switched off for them). */
  assignedAquarist?: boolean
}

export interface NoticeResult {
  /** False when a notice with the same id already existed. */
  created: boolean
  emailed: boolean
}

/** The user's e-mail choices per notice kind (missing = on). */
export function emailChoices(db: Tx, userId: string): Record<string, boolean> {
  return db.select({ kinds: notificationPreferences.emailKinds }).from(notificationPreferences)
    .where(eq(notificationPreferences.userId, userId)).get()?.kinds ?? {}
}

/** Writes the notice and, if it should go by e-mail, its outbox row. */
export function writeNotice(db: Tx, notice: Notice, now = new Date()): NoticeResult {
  const inserted = db.insert(notifications).values({
    ...(notice.id ? { id: notice.id } : {}),
    userId: notice.userId,
    organisationId: notice.organisationId,
    kind: notice.kind,
    title: notice.title,
    body: notice.body,
    link: notice.link ?? null,
    alertId: notice.alertId ?? null,
    createdAt: now.toISOString(),
    updatedAt: now.toISOString(),
  }).onConflictDoNothing().returning({ id: notifications.id }).all()
  if (!inserted.length) return { created: false, emailed: false }
  if (!notice.email) return { created: true, emailed: false }
  const user = db.select({ email: users.email, active: users.active }).from(users).where(eq(users.id, notice.userId)).get()
  if (!user?.active) return { created: true, emailed: false }
  const send = emailIsMandatory(notice.kind, notice.assignedAquarist ?? false) || wantsEmail(emailChoices(db, notice.userId), notice.kind)
  if (!send) return { created: true, emailed: false }
  enqueueMail(db, {
    organisationId: notice.organisationId,
    to: user.email,
    subject: notice.email.subject,
    text: notice.email.text,
    html: notice.email.html ?? null,
    kind: notice.kind,
    messageId: notice.email.messageId,
  }, now)
  return { created: true, emailed: true }
}
