/**
 * How many account e-mails (password resets, invitations) one address, network or inviting
 * account may cause, reserved before anything is looked up or sent. A refused request
 * gets the same answer as any other where an answer could reveal whether an address has
 * an account. Limits from runtimeConfig.mailThrottle (NUXT_MAIL_THROTTLE_*).
 */
import type { H3Event } from 'h3'
import { addressGroup } from '#server/domain/net/address-group'
import { reserveAttempt } from '#server/domain/throttle/throttle'

const HOUR = 3_600_000
const DAY = 24 * HOUR

function limits() {
  const c = useRuntimeConfig().mailThrottle
  return {
    resetPerAddressPerHour: Number(c.resetPerAddressPerHour),
    resetPerNetworkPerHour: Number(c.resetPerNetworkPerHour),
    invitePerAddressPerDay: Number(c.invitePerAddressPerDay),
    invitePerAccountPerHour: Number(c.invitePerAccountPerHour),
  }
}

/** Whether a reset mail to this address may be sent now (per address and per requesting network). */
export async function mayMailReset(event: H3Event, email: string): Promise<boolean> {
  const l = limits()
  return (await writeTransaction(db => reserveAttempt(db, [
    { key: `reset-mail:address:${email}`, max: l.resetPerAddressPerHour, windowMs: HOUR },
    { key: `reset-mail:network:${addressGroup(clientAddress(event))}`, max: l.resetPerNetworkPerHour, windowMs: HOUR },
  ], requestNow(event)))).granted
}

/** Whether this inviting account may send another invitation now; 429 when it has sent too many. */
export async function requireInvitationAllowance(event: H3Event, inviterId: string): Promise<void> {
  const reservation = await writeTransaction(db => reserveAttempt(db, [
    { key: `invite-mail:account:${inviterId}`, max: limits().invitePerAccountPerHour, windowMs: HOUR },
  ], requestNow(event)))
  if (!reservation.granted) {
    setResponseHeader(event, 'Retry-After', reservation.retryAfterSeconds)
    throw createError({ statusCode: 429, statusMessage: 'You have sent many invitations in the last hour. Try again later.' })
  }
}

/** Whether another invitation-related mail may go to this address today. */
export async function mayMailInvitee(event: H3Event, email: string): Promise<boolean> {
  return (await writeTransaction(db => reserveAttempt(db, [
    { key: `invite-mail:address:${email}`, max: limits().invitePerAddressPerDay, windowMs: DAY },
  ], requestNow(event)))).granted
}
