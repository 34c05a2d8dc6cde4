/**
 * The demo seed writes through the same field rules as the forms and routes: the valibot
 * schemas, the reading and event conversions and the server's volume computation. A demo
 * value a form would refuse stops the seed with the field and the form's message, so the
 * demo can never show data that Tidewright itself would not have accepted.
 */
import * as v from 'valibot'
import { ClientCreateSchema, SiteCreateSchema, type ClientInput, type SiteInput } from '../../../shared/schemas/clients'
import { EventInputSchema, type EventInput } from '../../../shared/schemas/reading'
import { TankCreateSchema, type TankInput } from '../../../shared/schemas/tanks'
import { toCanonicalReading, type CanonicalReading, type ReadingEntry } from '../../../shared/readings/entry'
import { toCanonicalEvent, type CanonicalEvent } from '../../../shared/readings/events'
import { tankVolumeFromDimensions } from '../../../shared/tanks/dimensions'
import { stageGateIssues } from '../../../shared/plan/gates'
import { surveyLoad, type SurveyLoadStage, type SurveyLoadTank } from '../../../shared/plan/survey-load'
import { stageDataSchema } from '../../../shared/schemas/plan'

interface Issue { field: string, message: string }

function refuse(what: string, issues: readonly Issue[]): never {
  throw new Error(`The demo ${what} breaks a field rule: ${issues.map(i => `${i.field}: ${i.message}`).join('; ')}`)
}

function parsed<const S extends v.GenericSchema>(schema: S, value: unknown, what: string): v.InferOutput<S> {
  const result = v.safeParse(schema, value)
  if (!result.success) refuse(what, result.issues.map(i => ({ field: v.getDotPath(i) ?? what, message: i.message })))
  return result.output
}

/** A test as the test form would store it: canonical values, notes and what was typed. */
export function checkedReading(entry: ReadingEntry, now: Date): CanonicalReading {
  const result = toCanonicalReading(entry, now)
  if (!result.ok) refuse(`test at ${entry.takenAt}`, result.issues)
  return result.reading
}

/** An event as the event form would store it. */
export function checkedEvent(input: v.InferInput<typeof EventInputSchema>, now: Date): CanonicalEvent {
  const what = `${input.kind} at ${input.at}`
  const result = toCanonicalEvent(parsed(EventInputSchema, input, what) as EventInput, now)
  if (!result.ok) refuse(what, result.issues)
  return result.event
}

/** A tank as POST /api/tanks would store it: the form's fields and the volume the server computes. */
export function checkedTank(input: v.InferInput<typeof TankCreateSchema>): TankInput & { volumeLitres: number } {
  const tank = parsed(TankCreateSchema, input, `tank "${input.name.slice(0, 40)}"`)
  const volume = tankVolumeFromDimensions(tank.shape, tank.dimensions)
  if (!volume.ok) refuse(`tank "${tank.name}"`, volume.issues)
  return { ...tank, dimensions: volume.dimensions, volumeLitres: volume.volumeLitres }
}

/** A client as the client form would store it. */
export function checkedClient(input: v.InferInput<typeof ClientCreateSchema>): ClientInput {
  return parsed(ClientCreateSchema, input, `client "${input.name}"`)
}

/** A site as the site form would store it. */
export function checkedSite(input: v.InferInput<typeof SiteCreateSchema>): SiteInput {
  return parsed(SiteCreateSchema, input, `site "${input.label}"`)
}

/** Values the server stamps on a stage itself (who recorded a structural check, and when), never typed into the form. */
const SERVER_STAMPED_STAGE_VALUES = new Set(['structuralCheckRecordedBy', 'structuralCheckRecordedAt'])

/**
 * A finished or open stage's helper values as the stage form and its commissioning gate would
 * take them: the typed values against the stage's schema, then the gate (a leak test that
 * stood 24 h, a heavy floor's structural check) with the tank's facts and the plan's stages.
 */
export function checkedStageData(
  key: string,
  data: Record<string, unknown>,
  context: { closing: boolean, now: Date, tank: SurveyLoadTank, stages: readonly SurveyLoadStage[] },
): Record<string, unknown> {
  const what = `${key} stage`
  const typed = Object.fromEntries(Object.entries(data).filter(([name]) => !SERVER_STAMPED_STAGE_VALUES.has(name)))
  parsed(stageDataSchema(key), typed, what)
  const stages = context.stages.map(stage => (stage.key === key ? { key, data } : stage))
  const loadRatio = surveyLoad(context.tank, stages)?.ratioToDesignLiveLoad ?? null
  const issues = stageGateIssues(key, data, context.closing, { now: context.now, surveyLoadRatio: loadRatio })
  if (issues.length) refuse(what, issues)
  return data
}
