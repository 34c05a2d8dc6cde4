/**
 * The engine's judgement a sign-off request or decision rests on, the check, inside the command's
 * write transaction, that it still speaks for the tank (its tests and events, its profile and its
 * company's thresholds: all the engine read), and the loop that evaluates again when it does not
 * (onCurrentEvaluation). Made on the request loop for an ordinary tank and in the heavy-work pool
 * for a long history (a request's: server/workers/sign-off-evaluation.ts; a decision is made there
 * whole, server/workers/sign-off-decision.ts), by the same function; either way the evaluation is
 * made before the transaction, so the check holds on both. Framework-free: takes a `Db`.
 */
import { isDeepStrictEqual } from 'node:util'
import type { CycleInput, Verdict } from '#shared/cycle/types'
import type { Db } from '#server/db/connection'
import { engineSettingsFor, verdictWithInput, type EngineSettings } from '#server/db/verdicts'
import { tankDataRevisionInDb } from '#server/domain/readings/data-revision'
import { SignOffRefused } from './refusal'

/** What a sign-off request rests on: the engine's verdict on the tank as of `now` and what it was made under. */
export interface SignOffVerdict {
  /** The moment the request or decision is made at (ISO 8601). */
  now: string
  /** The verdict made from the tank's input as the database held it, read anew. */
  verdict: Verdict
  /** The tank's data revision (server/domain/readings/data-revision.ts), read before the rows were. */
  revision: number
  /**
   * The tank's profile and company thresholds the verdict was made under: the input's own part
   * besides the history (small, so the pool hands it back even when it hands back no input).
   */
  settings: EngineSettings
}

/** What a sign-off decision rests on and records: the same, with the engine input the verdict was made from. */
export interface SignOffEvaluation extends SignOffVerdict {
  /** `input.now` is `now`. */
  input: CycleInput
}

/**
 * The evaluation without its input, for a request (which records no input): the pool hands back
 * this much instead of copying a long history over to the request loop.
 */
export function withoutInput({ now, verdict, revision, settings }: SignOffVerdict): SignOffVerdict {
  return { now, verdict, revision, settings }
}

/**
 * The tank's engine input as of `now`, read anew, its verdict, the data revision it is at and the
 * settings it was made under (the input's own, not read again); undefined if there is no such tank.
 * The revision is read first: a change landing while the rows are read moves the count past it, so
 * the evaluation is judged out of date, never a newer one taken for complete.
 */
export function evaluateForSignOff(db: Db, tankId: string, now: Date): SignOffEvaluation | undefined {
  const revision = tankDataRevisionInDb(db, tankId)
  const found = verdictWithInput(db, tankId, now)
  if (!found) return undefined
  const { tank, thresholds } = found.input
  return { ...found, now: found.input.now, revision, settings: { tank, thresholds } }
}

/** Refused when the tank's tests, events, profile or thresholds changed after the evaluation the command was given was made. */
export class EvaluationOutdated extends SignOffRefused {
  constructor() {
    super(409, 'The tank\'s tests or settings changed while the sign-off was being checked. Try again.')
    this.name = 'EvaluationOutdated'
  }
}

/**
 * Called inside the command's write transaction: refuses (EvaluationOutdated) when a test, a
 * correction or an event landed on the tank after the evaluation was made, or when what else the
 * engine read (the tank's volume, cycle method and start, the company's thresholds), built anew by
 * the engine input's own builder, is no longer what the verdict was made under. So no request and
 * no decision is stored on a verdict that leaves out a test (a danger test saved while a
 * supervisor's approval was being checked) or that limits or a profile no longer in force gave.
 */
export function assertEvaluationCurrent(db: Db, tankId: string, evaluation: SignOffVerdict): void {
  if (tankDataRevisionInDb(db, tankId) !== evaluation.revision) throw new EvaluationOutdated()
  if (!isDeepStrictEqual(engineSettingsFor(db, tankId), evaluation.settings)) throw new EvaluationOutdated()
}

/** How many times a sign-off is evaluated before it is refused because the tank's tests or settings keep changing meanwhile. */
export const SIGN_OFF_ATTEMPTS = 3

/** The steps of a sign-off command run on an evaluation made just before it. */
export interface EvaluatedCommand<T, E extends SignOffVerdict = SignOffEvaluation> {
  /** The command's refusals that need no engine: answered before any evaluation is made. */
  check: () => void
  /** Makes the evaluation (the caller decides where: the pool for a long history). */
  evaluate: () => Promise<E>
  /** The command itself, which refuses (EvaluationOutdated) when the tank's data or settings moved past the evaluation. */
  command: (evaluation: E) => T | Promise<T>
}

/**
 * Runs a sign-off command on an evaluation of the tank made just before it. Refused because a test,
 * correction or event landed, or the tank's profile or the company's thresholds changed, while the
 * evaluation was made, it is checked, evaluated and run again, SIGN_OFF_ATTEMPTS times in all; then
 * the refusal (409) stands.
 */
export async function onCurrentEvaluation<T, E extends SignOffVerdict = SignOffEvaluation>({ check, evaluate, command }: EvaluatedCommand<T, E>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    check()
    const evaluation = await evaluate()
    try {
      return await command(evaluation)
    }
    catch (error) {
      if (!(error instanceof EvaluationOutdated) || attempt >= SIGN_OFF_ATTEMPTS) throw error
    }
  }
}
