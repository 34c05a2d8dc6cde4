/**
 * Slows, then refuses, repeated failed sign-ins, per account and per client address.
 * Failures live in the database so a restart does not reset an attack in progress.
 * Limits come from runtimeConfig.signIn (NUXT_SIGN_IN_* variables).
 */
import { and, eq, gte, lt, sql } from 'drizzle-orm'
import { signInFailures } from '../db/schema'

/** Failures after which each further attempt is slowed down. */
const SLOW_AFTER = 3
const MAX_DELAY_MS = 2000

export interface ThrottleState {
  refused: boolean
  delayMs: number
  retryAfterSeconds: number
}

function limits() {
  const { accountFailureLimit, addressFailureLimit, windowMinutes } = useRuntimeConfig().signIn
  return { accountLimit: Number(accountFailureLimit), addressLimit: Number(addressFailureLimit), windowMs: Number(windowMinutes) * 60_000 }
}

function keys(email: string, address: string) {
  return { account: `account:${email}`, address: `address:${address}` }
}

function countSince(key: string, since: string): number {
  const row = useDB().select({ n: sql<number>`count(*)` }).from(signInFailures)
    .where(and(eq(signInFailures.key, key), gte(signInFailures.at, since))).get()
  return row?.n ?? 0
}

/** How this attempt must be treated, decided before the password is checked. */
export function signInThrottle(email: string, address: string, now = Date.now()): ThrottleState {
  const { accountLimit, addressLimit, windowMs } = limits()
  const since = new Date(now - windowMs).toISOString()
  const k = keys(email, address)
  const accountFailures = countSince(k.account, since)
  const addressFailures = countSince(k.address, since)
  const refused = accountFailures >= accountLimit || addressFailures >= addressLimit
  // An address trying many accounts is slowed more gently than one account guessed at.
  const pressure = Math.max(accountFailures, addressFailures / 4)
  const delayMs = pressure >= SLOW_AFTER ? Math.min(MAX_DELAY_MS, 250 * (pressure - SLOW_AFTER + 1)) : 0
  return { refused, delayMs, retryAfterSeconds: Math.ceil(windowMs / 1000) }
}

/** Records a failed attempt and prunes entries older than the window. */
export function recordSignInFailure(email: string, address: string, now = Date.now()): void {
  const k = keys(email, address)
  const at = new Date(now).toISOString()
  const db = useDB()
  db.insert(signInFailures).values([{ key: k.account, at }, { key: k.address, at }]).run()
  db.delete(signInFailures).where(lt(signInFailures.at, new Date(now - limits().windowMs).toISOString())).run()
}

/** A successful sign-in clears the account's failures; the address keeps its record. */
export function clearSignInFailures(email: string): void {
  useDB().delete(signInFailures).where(eq(signInFailures.key, keys(email, '').account)).run()
}
