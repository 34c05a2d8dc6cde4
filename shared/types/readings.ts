/** API response shapes for readings, events, charts and verdicts. Values are canonical. */
import type { PageOf } from './list'
import type { CycleAction, CyclePhase, Finding, Verdict } from '../cycle/types'
import type { RuleInfo } from '../cycle/registry'
import type { CanonicalValues, EntryFlag, KitBasisChoice } from '../readings/entry'
import type { EventKind, LivestockGroup } from '../vocabulary'

/** The correction that replaced a reading or event: the value every other view shows instead. */
export interface Replacement {
  id: string
  reason: string | null
  byName: string | null
  at: string
}

/**
 * Where a row stands among corrections. A correction is a new row naming the row it
 * replaces; the chart, the export and the engine show only current rows.
 */
export interface CorrectionTrail {
  /** False once a correction replaced it. */
  current: boolean
  /** On a correction: the row it replaces, and why. */
  correctsId: string | null
  correctionReason: string | null
  /** Once replaced: the correction, who made it, when and why. */
  replacedBy: Replacement | null
}

export interface ReadingView extends CanonicalValues, CorrectionTrail {
  id: string
  takenAt: string
  notes: string | null
  entered: Record<string, unknown>
  enteredBy: string | null
  enteredByName: string | null
  createdAt: string
  updatedAt: string
  /** Whether the signed-in user may edit or delete it now. */
  canEdit: boolean
  flags: EntryFlag[]
}

export type ReadingList = PageOf<ReadingView>

/** POST/PATCH answer: the reading, what it flagged, and the verdict it led to. */
export interface ReadingSaved {
  reading: ReadingView
  flags: EntryFlag[]
  phase: CyclePhase | null
  /** The verdict's danger and caution findings, danger first: what the person at the tank must see at once. */
  findings: Finding[]
  /** What to do next, as the verdict says it. */
  actions: CycleAction[]
  /** The rules `findings` name, for staff. */
  rules: CitedRules
}

export interface EventView extends CorrectionTrail {
  id: string
  at: string
  kind: EventKind
  amount: number | null
  group: LivestockGroup | null
  notes: string | null
  enteredBy: string | null
  enteredByName: string | null
  createdAt: string
  canEdit: boolean
}

export type EventList = PageOf<EventView>

/** The compact chart payload: parallel arrays, epoch seconds. */
export interface ChartData {
  t: number[]
  ammoniaN: (number | null)[]
  nitriteN: (number | null)[]
  nitrateN: (number | null)[]
  pH: (number | null)[]
  temperatureC: (number | null)[]
  salinity: (number | null)[]
  events: { t: number, kind: string, amount: number | null, group: string | null }[]
  /** Tests drawn (the latest, at most CHART_MAX_TESTS), and whether the range holds older ones. */
  tests: { shown: number, older: boolean }
  phase: CyclePhase
  completedOn: string | null
  limits: { ammoniaZeroN: number, nitriteZeroN: number, riseN: number, ammoniaActionN: number, salinityMin: number, salinityMax: number, temperatureMinC: number, temperatureMaxC: number }
}

export interface VerdictReading {
  id: string
  takenAt: string
  ammoniaN: number | null
  nitriteN: number | null
  nitrateN: number | null
  /** The conditions too, so a client's sentence can say the value a finding rests on. */
  pH: number | null
  temperatureC: number | null
  salinity: number | null
}

/** What staff read of a rule beside a finding or blocker: its id, what it checks and on what source. */
export type CitedRule = Pick<RuleInfo, 'id' | 'description' | 'source'>

/**
 * The rules an answer's findings and blockers name, by id, shaped by the server
 * (`server/utils/cited-rules.ts`): the page shows them without loading the rule registry.
 */
export type CitedRules = Record<string, CitedRule>

export interface VerdictView {
  verdict: Verdict
  evaluatedAt: string
  /** The rules the verdict's findings and livestock blockers name, for staff. */
  rules: CitedRules
  /** The readings the findings rest on. */
  readings: Record<string, VerdictReading>
}

export interface ImportRowError {
  row: number
  field: string
  message: string
}

export interface ImportPreview {
  headers: string[]
  mapping: Record<string, string>
  /** The basis the nitrogen values were read in. */
  basis: KitBasisChoice
  rows: number
  valid: number
  duplicates: number
  /** Rows refused; `errors` lists their messages (at most 200). */
  errorRows: number
  errors: ImportRowError[]
  /** The first rows as they would be stored. */
  preview: { row: number, takenAt: string, ammoniaN: number | null, nitriteN: number | null, nitrateN: number | null, pH: number | null, temperatureC: number | null, salinity: number | null }[]
  dryRun: boolean
  inserted: number
}
