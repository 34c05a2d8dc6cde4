/**
 * Sign-off rows and what every command reads about them, framework-free: the history, the
 * waiting request, the current approval, who may decide, and the records shaped for the API.
 */
import { randomBytes } from 'node:crypto'
import { and, desc, eq, ne, sql } from 'drizzle-orm'
import type { SignOffRecord, SignOffRecordWithSnapshot } from '#shared/types/sign-off'
import type { Role } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import type { tanks } from '#server/db/schema'
import { alerts, signOffs, users } from '#server/db/schema'
import { readOrganisationSettings } from '#server/db/settings'

export type TankRow = typeof tanks.$inferSelect
export type SignOffRow = typeof signOffs.$inferSelect

/** Whoever runs a sign-off command: the signed-in person as the route knows them. */
export interface SignOffActor {
  id: string
  organisationId: string
  role: Role
}

const CROCKFORD = '0123456789ABCDEFGHJKMNPQRSTVWXYZ'

/** A random, unguessable code (120 bits) shaped TW-XXXX-XXXX-XXXX-XXXX-XXXX-XXXX. */
export function newVerificationCode(): string {
  const bytes = randomBytes(15)
  let bits = 0
  let value = 0
  let out = ''
  for (const byte of bytes) {
    value = (value << 8) | byte
    bits += 8
    while (bits >= 5) {
      out += CROCKFORD[(value >>> (bits - 5)) & 31]
      bits -= 5
    }
  }
  return `TW-${out.match(/.{4}/g)!.join('-')}`
}

/** Names of an organisation's users by id, for shaping responses. */
export function organisationUserNames(db: Db, organisationId: string): Map<string, string> {
  const rows = db.select({ id: users.id, name: users.name }).from(users).where(eq(users.organisationId, organisationId)).all()
  return new Map(rows.map(r => [r.id, r.name]))
}

export const nameOf = (names: Map<string, string>, id: string | null) => (id ? names.get(id) ?? null : null)

/** A sign-off row shaped for the API, people by name. */
export function toSignOffRecord(row: SignOffRow, names: Map<string, string>): SignOffRecord {
  return {
    id: row.id,
    status: row.status,
    requestedAt: row.requestedAt,
    requestedByName: nameOf(names, row.requestedBy),
    requestNote: row.requestNote,
    decidedAt: row.decidedAt,
    decidedByName: nameOf(names, row.decidedBy),
    decisionNote: row.decisionNote,
    override: row.override,
    ruleSetVersion: row.ruleSetVersion,
    reopenedAt: row.reopenedAt,
    reopenedByName: nameOf(names, row.reopenedBy),
    reopenReason: row.reopenReason,
    verificationCode: row.verificationCode,
  }
}

/** The record with what was stored at the decision. */
export function toSignOffRecordWithSnapshot(row: SignOffRow, names: Map<string, string>): SignOffRecordWithSnapshot {
  return { ...toSignOffRecord(row, names), snapshot: row.snapshot ?? null }
}

/** Every sign-off of a tank, newest first. */
export function signOffHistory(db: Db, tankId: string): SignOffRow[] {
  return db.select().from(signOffs).where(eq(signOffs.tankId, tankId)).orderBy(desc(signOffs.requestedAt), desc(signOffs.createdAt)).all()
}

/** The request waiting for a decision, if any. */
export function pendingRequest(db: Db, tankId: string): SignOffRow | undefined {
  return db.select().from(signOffs).where(and(eq(signOffs.tankId, tankId), eq(signOffs.status, 'requested'))).get()
}

/** The stage lock, the certificate and reopening ask it (a save asks only the decision time, lock.ts): prepared once. */
const approvedSignOff = preparedPerDb(db => db.select().from(signOffs)
  .where(and(eq(signOffs.tankId, sql.placeholder('tankId')), eq(signOffs.status, 'approved')))
  .orderBy(desc(signOffs.decidedAt)).prepare())

/** The tank's current approved sign-off (not reopened), if there is one. */
export function currentApprovedSignOff(db: Db, tankId: string): SignOffRow | undefined {
  return approvedSignOff(db).get({ tankId })
}

/** Alerts not yet resolved; every alert is raised by a danger finding. */
export function unresolvedAlertCount(db: Db, tankId: string): number {
  return db.select({ n: sql<number>`count(*)` }).from(alerts)
    .where(and(eq(alerts.tankId, tankId), ne(alerts.status, 'resolved'))).get()?.n ?? 0
}

/** The tank's supervisor, or an admin of its organisation. */
export function maySignOff(actor: SignOffActor, tank: Pick<TankRow, 'organisationId' | 'supervisorId'>): boolean {
  if (tank.organisationId !== actor.organisationId) return false
  return actor.role === 'admin' || (actor.role === 'supervisor' && tank.supervisorId === actor.id)
}

/** The company's sign-off policy (settings.signOff.requesterMayApprove): may the requester approve their own sign-off request. */
export function selfApprovalAllowed(db: Db, organisationId: string): boolean {
  return readOrganisationSettings(db, organisationId).signOff.requesterMayApprove
}
