/**
 * What was signed stays signed, framework-free: the tank's facts and stages captured at
 * the decision, which of them a later edit would touch, which entries the signed input holds,
 * and amendments (a change to signed facts with a reason, printed on the certificate).
 */
import { and, asc, eq, sql } from 'drizzle-orm'
import type { CycleInput } from '#shared/cycle/types'
import type { SignedTankFacts, SignOffAmendmentView, SignOffSnapshot } from '#shared/types/sign-off'
import type { Db } from '#server/db/connection'
import { preparedPerDb } from '#server/db/prepared'
import { clients, organisations, planStages, signOffAmendments, signOffInputEntries, signOffInputs, sites, tanks, users } from '#server/db/schema'

type TankRow = typeof tanks.$inferSelect

/** The tank's facts and build-plan stages as they stand now, for the snapshot of a decision. */
export function captureSignedFacts(db: Db, tankId: string, deciderId: string): SignedTankFacts {
  const row = db.select({ tank: tanks, clientName: clients.name, siteLabel: sites.label, company: organisations.name })
    .from(tanks)
    .innerJoin(clients, eq(clients.id, tanks.clientId))
    .innerJoin(organisations, eq(organisations.id, tanks.organisationId))
    .leftJoin(sites, eq(sites.id, tanks.siteId))
    .where(eq(tanks.id, tankId)).get()
  if (!row) throw new Error(`tank ${tankId} not found`)
  const nameOf = (id: string | null) => (id ? db.select({ name: users.name }).from(users).where(eq(users.id, id)).get()?.name ?? null : null)
  const stages = db.select().from(planStages).where(eq(planStages.tankId, tankId)).orderBy(asc(planStages.position)).all()
  const t = row.tank
  return {
    company: row.company,
    tankName: t.name,
    clientName: row.clientName,
    siteLabel: row.siteLabel ?? null,
    shape: t.shape,
    dimensions: (t.dimensions ?? {}) as Record<string, number | undefined>,
    volumeLitres: t.volumeLitres,
    sumpLitres: t.sumpLitres,
    cycleMethod: t.cycleMethod,
    cycleStartedAt: t.cycleStartedAt,
    aquaristName: nameOf(t.aquaristId),
    supervisorName: nameOf(deciderId) ?? '—',
    stages: stages.map(s => ({ key: s.key, title: s.title, status: s.status, completedAt: s.completedAt })),
  }
}

/** Tank columns a certificate prints (directly or through the volume): they change only by amendment or reopening. */
export const SIGNED_TANK_FIELDS = ['name', 'clientId', 'siteId', 'shape', 'dimensions', 'volumeLitres', 'sumpLitres', 'cycleMethod', 'cycleStartedAt'] as const
export type SignedTankField = typeof SIGNED_TANK_FIELDS[number]

/** Each signed field in a person's words, as the certificate lists an amendment and a refusal names it. */
export const SIGNED_FIELD_LABELS: Readonly<Record<SignedTankField, string>> = {
  name: 'name', clientId: 'client', siteId: 'site', shape: 'shape', dimensions: 'dimensions',
  volumeLitres: 'volume (L)', sumpLitres: 'sump (L)', cycleMethod: 'cycle method', cycleStartedAt: 'cycle start',
}

/** "its name is" / "its shape, dimensions and volume (L) are": the signed fields a change touches, in words. */
export function signedFieldsInWords(fields: readonly SignedTankField[]): string {
  const words = fields.map(field => SIGNED_FIELD_LABELS[field])
  const list = words.length > 1 ? `${words.slice(0, -1).join(', ')} and ${words.at(-1)}` : words[0] ?? ''
  return `its ${list} ${words.length > 1 ? 'are' : 'is'}`
}

/** The signed fields a change would alter, with their values before and after. */
export function signedFieldChanges(before: TankRow, changes: Partial<TankRow>): { field: SignedTankField, before: unknown, after: unknown }[] {
  return SIGNED_TANK_FIELDS
    .filter(field => field in changes && JSON.stringify(changes[field]) !== JSON.stringify(before[field]))
    .map(field => ({ field, before: before[field], after: changes[field] }))
}

/** Whether a stage was finished (done or skipped) in the signed snapshot: such a stage changes only after reopening. */
export function isSignedStage(snapshot: SignOffSnapshot | null | undefined, stageKey: string): boolean {
  const stage = snapshot?.facts?.stages.find(s => s.key === stageKey)
  return stage?.status === 'done' || stage?.status === 'skipped'
}

/**
 * Stores the engine input a decision was made from, and the id of every test and event it holds
 * (sign_off_input_entries, for the lock). Call inside the decision's transaction: both are the
 * signed record, written once and never rewritten. One prepared insert run per id: for a
 * 100,000-test history a quarter of the time multi-row inserts took (bench/README.md).
 */
export function recordSignedInput(db: Db, signOffId: string, input: CycleInput): void {
  db.insert(signOffInputs).values({ signOffId, input }).run()
  const entry = db.insert(signOffInputEntries).values({ signOffId, entryId: sql.placeholder('entryId') }).prepare()
  for (const entryId of new Set([...input.readings.map(r => r.id), ...(input.events ?? []).map(e => e.id)])) entry.run({ entryId })
}

/**
 * Whether a reading or event is in the engine input a decision was made from: a lookup by key in
 * the entries recorded with it, prepared once. The input itself (megabytes of JSON for an
 * imported history) is not read on the request loop for one id.
 */
const inputHolds = preparedPerDb(db => db.select({ held: sql<number>`1` }).from(signOffInputEntries)
  .where(and(eq(signOffInputEntries.signOffId, sql.placeholder('signOffId')), eq(signOffInputEntries.entryId, sql.placeholder('entryId')))).prepare())

/** Whether the input the sign-off was decided on holds this reading or event, whatever its date. */
export function signedInputHolds(db: Db, signOffId: string, entryId: string): boolean {
  return inputHolds(db).get({ signOffId, entryId }) !== undefined
}

/** The engine input the sign-off was decided on, or undefined (not decided). Megabytes for a long history: read it in the heavy-work pool. */
export function signedInput(db: Db, signOffId: string): CycleInput | undefined {
  return db.select({ input: signOffInputs.input }).from(signOffInputs).where(eq(signOffInputs.signOffId, signOffId)).get()?.input
}

/** Records an amendment of a signed tank's facts (call inside the transaction that changes the tank). */
export function recordAmendment(db: Db, input: { signOffId: string, tankId: string, by: string, at: Date, reason: string, changes: { field: string, before: unknown, after: unknown }[] }): void {
  db.insert(signOffAmendments).values({
    signOffId: input.signOffId, tankId: input.tankId, amendedBy: input.by, amendedAt: input.at.toISOString(), reason: input.reason, changes: input.changes,
  }).run()
}

/** A sign-off's amendments, oldest first, with who made them. */
export function amendmentsOf(db: Db, signOffId: string): SignOffAmendmentView[] {
  return db.select({ a: signOffAmendments, byName: users.name }).from(signOffAmendments)
    .leftJoin(users, eq(users.id, signOffAmendments.amendedBy))
    .where(eq(signOffAmendments.signOffId, signOffId))
    .orderBy(asc(signOffAmendments.amendedAt)).all()
    .map(({ a, byName }) => ({ at: a.amendedAt, byName: byName ?? null, reason: a.reason, changes: a.changes }))
}
