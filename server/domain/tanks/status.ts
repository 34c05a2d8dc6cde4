/**
 * The only writer of a tank's status. Every change is checked against the lifecycle table
 * (shared/tanks/lifecycle.ts) and written together with its audit row in one transaction;
 * inside a caller's transaction it becomes part of it.
 */
import { eq } from 'drizzle-orm'
import { checkTransition, TANK_LIFECYCLE, type TankTrigger } from '#shared/tanks/lifecycle'
import type { Role } from '#shared/vocabulary'
import type { Db } from '#server/db/connection'
import { tanks } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'

type TankRow = typeof tanks.$inferSelect

export interface StatusChange {
  tankId: string
  trigger: TankTrigger
  /** The person who caused it; null when Tidewright reacts on its own to new data. */
  actor: { id: string, organisationId: string, role: Role } | null
  /** Set with the status when the cycle starts. */
  cycleStartedAt?: string
}

/** A status change the lifecycle does not allow: `role` (the actor may not) or `status` (not from here). */
export class TankStatusRefused extends Error {
  constructor(readonly refusal: 'role' | 'status' | 'missing', message: string) {
    super(message)
    this.name = 'TankStatusRefused'
  }
}

/** Moves the tank on by `trigger`, with its audit row; returns the tank as written. */
export function changeTankStatus(db: Db, change: StatusChange): TankRow {
  return db.transaction((tx) => {
    const tank = tx.select().from(tanks).where(eq(tanks.id, change.tankId)).get()
    if (!tank) throw new TankStatusRefused('missing', 'Tank not found')
    const check = checkTransition(tank.status, change.trigger, change.actor?.role ?? 'system')
    if (!check.ok) throw new TankStatusRefused(check.refusal, check.message)
    const cycleStartedAt = change.cycleStartedAt ?? tank.cycleStartedAt
    const after = tx.update(tanks).set({ status: check.to, cycleStartedAt }).where(eq(tanks.id, tank.id)).returning().get()
    recordAudit(tx, { id: change.actor?.id ?? null, organisationId: tank.organisationId }, {
      action: 'tank.status',
      entity: 'tank',
      entityId: tank.id,
      before: { status: tank.status, cycleStartedAt: tank.cycleStartedAt },
      after: { status: after.status, cycleStartedAt: after.cycleStartedAt, trigger: change.trigger, because: TANK_LIFECYCLE[change.trigger].means },
    })
    return after
  })
}
