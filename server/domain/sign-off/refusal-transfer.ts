/**
 * A sign-off command's refusal carried across a thread: the heavy-work pool decides a long
 * history's sign-off (server/workers/sign-off-decision.ts), and an Error crossing threads keeps
 * only its message, not its class, status or field. The worker hands back what the refusal says;
 * the request loop throws it again as its own class, so the HTTP answer is the one the loop gives.
 */
import { TankStatusRefused } from '#server/domain/tanks/status'
import { EvaluationOutdated } from './evaluation'
import { SignOffRefused } from './refusal'

export type CarriedRefusal
  = | { kind: 'evaluation-outdated' }
    | { kind: 'sign-off', status: SignOffRefused['status'], message: string, details: SignOffRefused['details'] }
    | { kind: 'tank-status', refusal: TankStatusRefused['refusal'], message: string }

/** What a refusal says, to hand to another thread; undefined for any other error (thrown as it is). */
export function carriedRefusal(error: unknown): CarriedRefusal | undefined {
  if (error instanceof EvaluationOutdated) return { kind: 'evaluation-outdated' }
  if (error instanceof SignOffRefused) return { kind: 'sign-off', status: error.status, message: error.message, details: error.details }
  if (error instanceof TankStatusRefused) return { kind: 'tank-status', refusal: error.refusal, message: error.message }
  return undefined
}

/** The refusal again, as the class it was thrown as. */
export function refusalAgain(carried: CarriedRefusal): Error {
  switch (carried.kind) {
    case 'evaluation-outdated': return new EvaluationOutdated()
    case 'sign-off': return new SignOffRefused(carried.status, carried.message, carried.details)
    case 'tank-status': return new TankStatusRefused(carried.refusal, carried.message)
  }
}
