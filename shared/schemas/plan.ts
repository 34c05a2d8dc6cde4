import * as v from 'valibot'
import { ROOM_USES } from '../calc/weight'
import { STAGE_STATUSES } from '../vocabulary'
import { isoTimestampText } from './common'

const finite = (label: string, min: number, max: number) => v.optional(v.nullable(v.pipe(
  v.number(`${label} must be a number.`), v.finite(`${label} must be a number.`),
  v.minValue(min, `${label} is at least ${min}.`), v.maxValue(max, `${label} is at most ${max}.`),
)))
const isoTime = (label: string) => v.optional(v.nullable(isoTimestampText(`${label} must be a date and time.`)))
const clock = (label: string) => v.optional(v.nullable(v.pipe(v.string(), v.regex(/^([01]\d|2[0-3]):[0-5]\d$/, `${label} is a time HH:MM.`))))

/** The helper values each default stage keeps in its `data`; canonical units only. */
export const STAGE_DATA_SCHEMAS = {
  'site-survey': v.strictObject({
    roomUse: v.optional(v.nullable(v.picklist(ROOM_USES, 'Choose how the room is used.'))),
    shellThicknessMm: finite('Glass or acrylic thickness', 1, 50),
    otherKg: finite('Stand and equipment weight', 0, 5000),
    /** Kept for surveys recorded before the checklist carried the electrical item alone. */
    outletsProtected: v.optional(v.nullable(v.boolean('Yes or no.'))),
    structuralCheckDone: v.optional(v.nullable(v.boolean('Yes or no.'))),
    structuralCheckBy: v.optional(v.nullable(v.pipe(v.string('Who checked the floor?'), v.trim(), v.maxLength(120, 'At most 120 characters.')))),
  }, 'Unknown site-survey value.'),
  'leak-test': v.strictObject({
    startedAt: isoTime('Start'),
    endedAt: isoTime('End'),
    result: v.optional(v.nullable(v.picklist(['pass', 'fail'], 'Pass or fail.'))),
  }, 'Unknown leak-test value.'),
  'substrate': v.strictObject({
    depthMm: finite('Sand depth', 0, 300),
    bagKg: finite('Bag size', 0.5, 100),
  }, 'Unknown substrate value.'),
  'water-fill': v.strictObject({
    targetSalinity: finite('Target salinity', 25, 40),
    temperatureC: finite('Temperature', 15, 32),
    measuredSalinity: finite('Measured salinity', 0, 45),
    rockKg: finite('Rock', 0, 2000),
  }, 'Unknown water-fill value.'),
  'lighting-ramp': v.strictObject({
    photoperiodHours: finite('Photoperiod', 0, 16),
    rampMinutes: finite('Ramp', 0, 240),
    plateauPercent: finite('Plateau', 0, 100),
    startTime: clock('Lights on'),
    ppfdAtFull: finite('PPFD at full output', 1, 3000),
    acclimationWeeks: finite('Acclimation weeks', 1, 52),
    acclimationStartPercent: finite('Starting plateau', 0, 100),
    acclimationEndPercent: finite('Final plateau', 0, 100),
  }, 'Unknown lighting value.'),
} as const

/** Stages of a company's own design keep short free-form values. */
export const CustomStageDataSchema = v.pipe(
  v.record(v.pipe(v.string(), v.maxLength(40, 'Value names are at most 40 characters.')), v.union([v.pipe(v.string(), v.maxLength(500, 'Values are at most 500 characters.')), v.number(), v.boolean(), v.null()], 'A value is text, a number or yes/no.')),
  v.check(record => Object.keys(record).length <= 20, 'At most 20 values per stage.'),
)

/** The schema a stage's helper values are checked against: its own for a default stage, the free-form one otherwise. */
export function stageDataSchema(key: string): v.GenericSchema {
  return (STAGE_DATA_SCHEMAS as Record<string, v.GenericSchema>)[key] ?? CustomStageDataSchema
}

/** PATCH /api/tanks/:id/stages/:stageId body. `data` is checked against the stage's own schema by the server. */
export const StagePatchSchema = v.pipe(
  v.object({
    status: v.optional(v.picklist(STAGE_STATUSES, 'Unknown stage status.')),
    skipReason: v.optional(v.nullable(v.pipe(v.string(), v.trim(), v.maxLength(500, 'The reason is at most 500 characters.')))),
    checklist: v.optional(v.pipe(v.array(v.object({
      id: v.pipe(v.string(), v.maxLength(80, 'Unknown checklist item.')),
      done: v.boolean('Ticked or not.'),
    })), v.maxLength(50, 'Too many checklist items.'))),
    notes: v.optional(v.nullable(v.pipe(v.string(), v.maxLength(5000, 'Notes are at most 5000 characters.')))),
    data: v.optional(v.record(v.string(), v.unknown())),
  }),
  v.forward(
    v.check(input => input.status !== 'skipped' || !!input.skipReason?.trim(), 'Say why the stage is skipped.'),
    ['skipReason'],
  ),
)
export type StagePatch = v.InferOutput<typeof StagePatchSchema>

/** Route parameters of /api/tanks/:id/stages/:stageId. */
export const StageParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
  stageId: v.pipe(v.string(), v.uuid('Not a valid id.')),
})

/** PUT /api/plan-template body: the company's stages in order. */
export const PlanTemplateSchema = v.object({
  stages: v.pipe(
    v.array(v.object({
      key: v.pipe(v.string('Each stage needs a key.'), v.trim(), v.regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Keys are lower-case words joined by hyphens.'), v.maxLength(40, 'Keys are at most 40 characters.')),
      title: v.pipe(v.string('Each stage needs a title.'), v.trim(), v.minLength(1, 'Each stage needs a title.'), v.maxLength(80, 'Titles are at most 80 characters.')),
      checklist: v.pipe(v.array(v.pipe(v.string(), v.trim(), v.minLength(1, 'Checklist items cannot be empty.'), v.maxLength(200, 'Checklist items are at most 200 characters.'))), v.maxLength(30, 'At most 30 checklist items per stage.')),
    })),
    v.minLength(1, 'A plan needs at least one stage.'),
    v.maxLength(30, 'At most 30 stages.'),
    v.check(stages => new Set(stages.map(s => s.key)).size === stages.length, 'Each stage key must be different.'),
  ),
})
export type PlanTemplateInput = v.InferOutput<typeof PlanTemplateSchema>
