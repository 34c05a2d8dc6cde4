/**
 * Pure helpers for sign-off: whether approving would go against the engine's verdict,
 * the first weeks' livestock plan from the verdict's readiness, the lighting
 * acclimation dated from the sign-off, and the last value of each test before it.
 * No framework imports; the server, the pages and the certificate share them.
 */
import { acclimationPlan, ACCLIMATION_DEFAULTS } from '../lighting/schedule'
import type { CycleInput, Verdict } from '../cycle/types'
import { LIVESTOCK_GROUPS, type LivestockGroup } from '../vocabulary'

const DAY_MS = 86_400_000

/** Plain names for the engine's livestock groups. */
export const LIVESTOCK_GROUP_LABELS: Record<LivestockGroup, string> = {
  'fish': 'Fish',
  'invertebrates': 'Clean-up crew and other invertebrates',
  'soft-coral': 'Soft corals',
  'lps-coral': 'Large-polyp stony corals (LPS)',
  'sps-coral': 'Small-polyp stony corals (SPS)',
}

/**
 * Why approving now would be an override of the engine: the phase is not complete, the
 * verdict carries a danger finding, or danger alerts are still unresolved. Empty when the
 * engine agrees.
 */
export function overrideGrounds(verdict: Pick<Verdict, 'phase' | 'findings'>, unresolvedDangerAlerts: number): string[] {
  const grounds: string[] = []
  if (verdict.phase !== 'complete') grounds.push(`The engine's phase is "${verdict.phase}", not complete.`)
  const dangers = verdict.findings.filter(f => f.severity === 'danger')
  if (dangers.length) grounds.push(`The verdict has ${dangers.length} danger finding${dangers.length === 1 ? '' : 's'}.`)
  if (unresolvedDangerAlerts > 0) grounds.push(`${unresolvedDangerAlerts} danger alert${unresolvedDangerAlerts === 1 ? ' is' : 's are'} not resolved.`)
  return grounds
}

export interface StockingStep {
  order: number
  group: LivestockGroup
  label: string
  allowed: boolean
  /** Earliest time the timeline allows the group (ISO), or null when the engine gives none. */
  earliest: string | null
  blockers: string[]
}

/**
 * The order livestock may go in: the engine's groups from least to most demanding, each
 * with its earliest date and what still blocks it, as the verdict's readiness says.
 */
export function stockingSteps(verdict: Pick<Verdict, 'readiness'>): StockingStep[] {
  return LIVESTOCK_GROUPS.map((group, i) => {
    const r = verdict.readiness[group]
    return { order: i + 1, group, label: LIVESTOCK_GROUP_LABELS[group], allowed: r.allowed, earliest: r.earliest, blockers: [...r.blockers] }
  })
}

export interface DatedAcclimationStep {
  week: number
  /** Start of that week (ISO). */
  from: string
  plateauPercent: number
}

/** How the plateau is raised after the cycle: over how many weeks, from and to what percent. */
export interface AcclimationSettings {
  weeks: number
  startPercent: number
  endPercent: number
}

const settingOf = (data: Record<string, unknown>, key: string, fallback: number): number => {
  const value = data[key]
  return typeof value === 'number' && Number.isFinite(value) ? value : fallback
}

/** The tank's own acclimation settings, from its lighting-ramp stage; Tidewright's defaults where unset. */
export function acclimationSettingsOf(stages: readonly { key: string, data: Record<string, unknown> }[]): AcclimationSettings {
  const data = stages.find(s => s.key === 'lighting-ramp')?.data ?? {}
  return {
    weeks: settingOf(data, 'acclimationWeeks', ACCLIMATION_DEFAULTS.weeks),
    startPercent: settingOf(data, 'acclimationStartPercent', ACCLIMATION_DEFAULTS.startPercent),
    endPercent: settingOf(data, 'acclimationEndPercent', ACCLIMATION_DEFAULTS.endPercent),
  }
}

/** The lighting acclimation plan (shared/lighting) for the given settings, each week dated from `startIso`. */
export function datedAcclimation(startIso: string, settings: AcclimationSettings = ACCLIMATION_DEFAULTS): DatedAcclimationStep[] {
  const start = Date.parse(startIso)
  if (!Number.isFinite(start)) throw new RangeError(`startIso must be an ISO date (got ${startIso})`)
  return acclimationPlan(settings.weeks, settings.startPercent, settings.endPercent).map(step => ({
    week: step.week,
    from: new Date(start + step.week * 7 * DAY_MS).toISOString(),
    plateauPercent: Math.round(step.plateauPercent * 10) / 10,
  }))
}

export const FINAL_READING_KEYS = ['ammoniaN', 'nitriteN', 'nitrateN', 'pH', 'temperatureC', 'salinity', 'alkalinityDkh', 'calciumMgL', 'magnesiumMgL'] as const
export type FinalReadingKey = typeof FINAL_READING_KEYS[number]

export interface FinalValue {
  key: FinalReadingKey
  value: number
  takenAt: string
  readingId: string
}

/** The most recent value of each test in the engine input, at or before its `now`. */
export function finalReadings(input: Pick<CycleInput, 'readings' | 'now'>): FinalValue[] {
  const now = Date.parse(input.now)
  const ordered = [...input.readings]
    .filter(r => Date.parse(r.takenAt) <= now)
    .sort((a, b) => Date.parse(b.takenAt) - Date.parse(a.takenAt))
  const out: FinalValue[] = []
  for (const key of FINAL_READING_KEYS) {
    const hit = ordered.find(r => typeof r[key] === 'number')
    if (hit) out.push({ key, value: hit[key] as number, takenAt: hit.takenAt, readingId: hit.id })
  }
  return out
}
