/**
 * The transactional mail outbox: an e-mail is a row written in the same transaction as
 * the change that caused it, and a worker delivers it later. Framework-free so the seed,
 * the server and the tests share it.
 */
import { randomUUID } from 'node:crypto'
import { and, asc, eq, lte, or, sql } from 'drizzle-orm'
import type { Db } from './connection'
import { mailOutbox } from './schema'

export interface OutgoingMail {
  organisationId?: string | null
  to: string
  subject: string
  text: string
  html?: string | null
  kind: string
  /** A stable id: a retry sends the same Message-ID, and a repeated enqueue with it adds nothing. */
  messageId?: string
}

type Tx = Db

/** The domain the Message-IDs are minted under. */
export const MESSAGE_ID_DOMAIN = 'mail.tidewright.invalid'

/** Adds one e-mail to the outbox; returns its message id. With an existing message id it adds nothing. */
export function enqueueMail(db: Tx, mail: OutgoingMail, now = new Date()): string {
  const messageId = mail.messageId ?? `<${randomUUID()}@${MESSAGE_ID_DOMAIN}>`
  db.insert(mailOutbox).values({
    organisationId: mail.organisationId ?? null,
    toAddress: mail.to,
    subject: mail.subject,
    textBody: mail.text,
    htmlBody: mail.html ?? null,
    kind: mail.kind,
    messageId,
    nextAttemptAt: now.toISOString(),
  }).onConflictDoNothing({ target: mailOutbox.messageId }).run()
  return messageId
}

/** Attempts after which a message is given up as failed. */
export const MAX_ATTEMPTS = 12
/** A row left in `sending` this long (a crash mid-send) becomes due again. */
export const STALE_SENDING_MS = 10 * 60_000

/** Delay before the next attempt: 30 s doubling, at most an hour. */
export function backoffMs(attempts: number): number {
  return Math.min(60 * 60_000, 30_000 * 2 ** Math.max(0, attempts - 1))
}

export type OutboxRow = typeof mailOutbox.$inferSelect

/**
 * Claims one due message by moving it to `sending` in a single conditional UPDATE, so two
 * workers (or a worker and a test tick) can never both send it. Returns the row or undefined.
 */
export function claimNextMail(db: Db, now = new Date()): OutboxRow | undefined {
  const nowIso = now.toISOString()
  // Staleness is judged on the real clock: an injected test clock must not steal a row being sent.
  const realNow = new Date()
  const staleIso = new Date(realNow.getTime() - STALE_SENDING_MS).toISOString()
  for (let tries = 0; tries < 5; tries++) {
    const candidate = db.select({ id: mailOutbox.id }).from(mailOutbox)
      .where(or(
        and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, nowIso)),
        and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.updatedAt, staleIso)),
      ))
      .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id)).limit(1).get()
    if (!candidate) return undefined
    const claimed = db.update(mailOutbox)
      .set({ status: 'sending', attempts: sql`${mailOutbox.attempts} + 1`, updatedAt: realNow.toISOString() })
      .where(and(eq(mailOutbox.id, candidate.id), or(
        eq(mailOutbox.status, 'pending'),
        and(eq(mailOutbox.status, 'sending'), lte(mailOutbox.updatedAt, staleIso)),
      )))
      .returning().get()
    if (claimed) return claimed
  }
  return undefined
}

/** Records a delivered message. */
export function markMailSent(db: Db, id: string, now = new Date()): void {
  db.update(mailOutbox).set({ status: 'sent', sentAt: now.toISOString(), lastError: null }).where(eq(mailOutbox.id, id)).run()
}

/** Records a failed attempt: back to `pending` with a later due time, or `failed` after MAX_ATTEMPTS. */
export function markMailFailed(db: Db, row: Pick<OutboxRow, 'id' | 'attempts'>, error: string, now = new Date()): void {
  const giveUp = row.attempts >= MAX_ATTEMPTS
  db.update(mailOutbox).set({
    status: giveUp ? 'failed' : 'pending',
    lastError: error.slice(0, 500),
    nextAttemptAt: new Date(now.getTime() + backoffMs(row.attempts)).toISOString(),
  }).where(eq(mailOutbox.id, row.id)).run()
}
