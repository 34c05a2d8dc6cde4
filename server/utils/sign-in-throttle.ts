/**
 * Slows, then refuses, repeated sign-ins per account and per client network (an IPv6
 * /64 counts as one). Each attempt is reserved before the password is checked, so
 * guesses sent together are counted before any of them is checked; a correct password
 * gives its reservation back. Limits from runtimeConfig.signIn (NUXT_SIGN_IN_*).
 */
import type { H3Event } from 'h3'
import { addressGroup } from '#server/domain/net/address-group'
import { clearAttempts, releaseAttempt, reserveAttempt, type ThrottleLimit } from '#server/domain/throttle/throttle'

/** Failures after which each further attempt is slowed down. */
const SLOW_AFTER = 3
const MAX_DELAY_MS = 2000

export type SignInAttempt
  = | { refused: true, retryAfterSeconds: number }
    | { refused: false, delayMs: number, markIds: number[] }

function limitsFor(email: string, address: string | null): ThrottleLimit[] {
  const { accountFailureLimit, addressFailureLimit, windowMinutes } = useRuntimeConfig().signIn
  const windowMs = Number(windowMinutes) * 60_000
  return [
    { key: accountKey(email), max: Number(accountFailureLimit), windowMs },
    { key: `sign-in:network:${addressGroup(address)}`, max: Number(addressFailureLimit), windowMs },
  ]
}

function accountKey(email: string): string {
  return `sign-in:account:${email}`
}

/** Reserves this attempt, or refuses it when the account or the network has used up its attempts. */
export async function reserveSignIn(event: H3Event, email: string): Promise<SignInAttempt> {
  const reservation = await writeTransaction(db => reserveAttempt(db, limitsFor(email, clientAddress(event)), requestNow(event)))
  if (!reservation.granted) return { refused: true, retryAfterSeconds: reservation.retryAfterSeconds }
  const [accountAttempts = 0, networkAttempts = 0] = reservation.counts
  // A network trying many accounts is slowed more gently than one account guessed at.
  const pressure = Math.max(accountAttempts, networkAttempts / 4)
  const delayMs = pressure >= SLOW_AFTER ? Math.min(MAX_DELAY_MS, 250 * (pressure - SLOW_AFTER + 1)) : 0
  return { refused: false, delayMs, markIds: reservation.markIds }
}

/** A successful sign-in: its own attempt does not count, and the account's earlier failures are forgotten. */
export async function signInSucceeded(email: string, attempt: { markIds: number[] }): Promise<void> {
  await writeTransaction((db) => {
    releaseAttempt(db, attempt.markIds)
    clearAttempts(db, accountKey(email))
  })
}

/** A password was set with an e-mailed link: the account's failed sign-ins no longer count. */
export async function clearSignInFailures(email: string): Promise<void> {
  await writeTransaction(db => clearAttempts(db, accountKey(email)))
}
