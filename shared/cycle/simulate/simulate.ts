/**
 * Day-by-day tank histories from the nitrification model: what the aquarist did
 * (doses, bottled bacteria, water changes, livestock) and what the client's kits read
 * each day. Seeded and deterministic: the same plan always gives the same history,
 * so demo data, scenario tests and back-tests are reproducible.
 */

import type { CycleEvent, CycleInput, CycleMethod, CycleReading, LivestockGroup, Thresholds } from '../types'
import { AMMONIA_KIT, NITRATE_KIT, NITRITE_KIT, readKit, type KitReading } from './kits'
import { advance, changeWater, DEFAULT_RATES, type ModelRates, type TankState } from './model'

const HOUR_MS = 3_600_000
const DAY_MS = 24 * HOUR_MS

/** A small linear-congruential generator (Numerical Recipes constants): same seed, same sequence. */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0
    return state / 2 ** 32
  }
}

/** How the tank's bacteria start. */
export type Seeding = 'none' | 'bottled' | 'live-rock'

/** Starting AOB/NOB capacity, mg N/L per day (common practice, no published source). */
export const SEEDING_CAPACITY_N: Readonly<Record<Seeding, number>> = Object.freeze({
  'none': 0.01,
  'bottled': 0.05,
  'live-rock': 3,
})

/** Something the aquarist does, on a day (from the start) at an hour (UTC). */
export interface PlannedDose { day: number, hour?: number, amountN: number, /** false: the dose is logged without an amount. */ logAmount?: boolean, /** false: not logged at all (overfeeding, a rotting animal). */ logged?: boolean }
export interface PlannedWaterChange { day: number, hour?: number, percent: number }
export interface PlannedLivestock { day: number, hour?: number, group: LivestockGroup, count: number, /** ammonia the animals add, mg N/L per day. */ loadNPerDay: number }

/** Everything a simulated tank does. */
export interface SimulationPlan {
  seed: number
  /** ISO time of day 0, 00:00 UTC. */
  start: string
  /** Days simulated (tests on days 0 .. days-1). */
  days: number
  volumeLitres?: number
  method: CycleMethod
  seeding: Seeding
  /** Day and hour bottled bacteria went in, logged as an event (default day 0, 10:00 when seeding is 'bottled'). */
  bacteriaAt?: { day: number, hour: number }
  doses?: PlannedDose[]
  waterChanges?: PlannedWaterChange[]
  livestock?: PlannedLivestock[]
  /** Alkalinity at the start and of new water, dKH (default 8). */
  alkalinityDkh?: number
  /**
   * The aquarist doses buffer back to the starting alkalinity after each test (default true).
   * False lets nitrification drain it: the classic stall of a long fishless cycle.
   */
  buffered?: boolean
  newWaterAlkalinityDkh?: number
  /** Hour (UTC) of the daily test (default 18). */
  testHour?: number
  /** Days with no test. */
  skipDays?: number[]
  /** Extra tests, e.g. a check an hour after a dose. */
  extraTests?: Array<{ day: number, hour: number }>
  /** Chance a client reads one colour step off (default 0.05). */
  misreadChance?: number
  /** The nitrate kit is dead: it reads this step index whatever the water holds. */
  stuckNitrateStep?: number
  /** Tests also carry alkalinity (dKH), calcium and magnesium (mg/L). */
  reefChemistry?: boolean
  /** Phosphate (mg/L as PO4) as read each day; omitted when not given. */
  phosphateMgL?: (day: number) => number
  /** Starting AOB/NOB capacity, mg N/L per day, when it differs from the seeding's usual (a strong bottled product). */
  seedCapacityN?: number
  /** pH as read each day, when it does not follow alkalinity (a probe drifting, CO2 in a closed room). */
  pH?: (day: number) => number
  /** Water temperature (C) and salinity per day; defaults are a steady reef tank with small noise. */
  temperatureC?: (day: number) => number
  salinity?: (day: number) => number
  rates?: ModelRates
}

/** One test as the client entered it: kit readings on their bases, and canonical values. */
export interface SimulatedTest {
  day: number
  takenAt: string
  ammonia: KitReading
  nitrite: KitReading
  nitrate: KitReading
  ammoniaN: number
  nitriteN: number
  nitrateN: number
  pH: number
  temperatureC: number
  salinity: number
  alkalinityDkh?: number
  calciumMgL?: number
  magnesiumMgL?: number
  phosphateMgL?: number
}

/** One logged event. */
export interface SimulatedEvent {
  day: number
  at: string
  kind: CycleEvent['kind']
  amount?: number
  group?: LivestockGroup
}

/** The water's true state at each test, for back-tests of forecasts. */
export interface TruthPoint { day: number, at: string, state: TankState }

export interface Simulation {
  plan: SimulationPlan
  tests: SimulatedTest[]
  events: SimulatedEvent[]
  truth: TruthPoint[]
}

type Step
  = | { t: number, kind: 'dose', dose: PlannedDose }
    | { t: number, kind: 'water-change', change: PlannedWaterChange }
    | { t: number, kind: 'livestock', animals: PlannedLivestock }
    | { t: number, kind: 'bacteria' }
    | { t: number, kind: 'test', day: number }

const round = (value: number, decimals: number) => Math.round(value * 10 ** decimals) / 10 ** decimals

/** pH follows alkalinity: a tank losing its buffer loses pH too (a fitted line, common practice, no published source). */
function pHFor(alkalinityDkh: number, noise: number): number {
  return round(Math.max(7.2, Math.min(8.4, 7.55 + 0.07 * alkalinityDkh + noise)), 2)
}

function schedule(plan: SimulationPlan, startMs: number): Step[] {
  const at = (day: number, hour: number) => startMs + day * DAY_MS + hour * HOUR_MS
  const steps: Step[] = []
  if (plan.seeding === 'bottled') steps.push({ t: at(plan.bacteriaAt?.day ?? 0, plan.bacteriaAt?.hour ?? 10), kind: 'bacteria' })
  for (const dose of plan.doses ?? []) steps.push({ t: at(dose.day, dose.hour ?? 10), kind: 'dose', dose })
  for (const change of plan.waterChanges ?? []) steps.push({ t: at(change.day, change.hour ?? 12), kind: 'water-change', change })
  for (const animals of plan.livestock ?? []) steps.push({ t: at(animals.day, animals.hour ?? 14), kind: 'livestock', animals })
  const skip = new Set(plan.skipDays ?? [])
  for (let day = 0; day < plan.days; day += 1) if (!skip.has(day)) steps.push({ t: at(day, plan.testHour ?? 18), kind: 'test', day })
  for (const extra of plan.extraTests ?? []) steps.push({ t: at(extra.day, extra.hour), kind: 'test', day: extra.day })
  // Same instant: what was done comes before the test that follows it.
  return steps.sort((a, b) => a.t - b.t || Number(a.kind === 'test') - Number(b.kind === 'test'))
}

/** Runs the plan: one test a day (plus extras), events as logged. */
export function simulate(plan: SimulationPlan): Simulation {
  const random = seededRandom(plan.seed)
  const rates = plan.rates ?? DEFAULT_RATES
  const startMs = Date.parse(plan.start)
  const alkalinity = plan.alkalinityDkh ?? 8
  const capacity = plan.seedCapacityN ?? SEEDING_CAPACITY_N[plan.seeding]
  let state: TankState = { ammoniaN: 0, nitriteN: 0, nitrateN: 0, aobCapacityN: capacity, nobCapacityN: capacity, alkalinityDkh: alkalinity }
  let load = 0
  let clock = startMs
  const tests: SimulatedTest[] = []
  const events: SimulatedEvent[] = []
  const truth: TruthPoint[] = []
  const dayOf = (t: number) => Math.floor((t - startMs) / DAY_MS)
  const log = (t: number, event: Omit<SimulatedEvent, 'day' | 'at'>) => events.push({ day: dayOf(t), at: new Date(t).toISOString(), ...event })

  for (const step of schedule(plan, startMs)) {
    state = advance(state, (step.t - clock) / HOUR_MS, load, rates)
    clock = step.t
    if (step.kind === 'bacteria') {
      log(step.t, { kind: 'bacteria-dose' })
    }
    else if (step.kind === 'dose') {
      state = { ...state, ammoniaN: state.ammoniaN + step.dose.amountN }
      if (step.dose.logged !== false) log(step.t, { kind: 'ammonia-dose', ...(step.dose.logAmount === false ? {} : { amount: round(step.dose.amountN, 3) }) })
    }
    else if (step.kind === 'water-change') {
      state = changeWater(state, step.change.percent / 100, plan.newWaterAlkalinityDkh ?? alkalinity)
      log(step.t, { kind: 'water-change', amount: round(((plan.volumeLitres ?? 300) * step.change.percent) / 100, 1) })
    }
    else if (step.kind === 'livestock') {
      load += step.animals.loadNPerDay
      log(step.t, { kind: 'livestock-added', group: step.animals.group, amount: step.animals.count })
    }
    else {
      tests.push(readTests(plan, step.day, step.t, state, random))
      truth.push({ day: step.day, at: new Date(step.t).toISOString(), state: { ...state } })
      if (plan.buffered !== false) state = { ...state, alkalinityDkh: Math.max(state.alkalinityDkh, alkalinity) }
    }
  }
  return { plan, tests, events, truth }
}

function readTests(plan: SimulationPlan, day: number, t: number, state: TankState, random: () => number): SimulatedTest {
  const misread = plan.misreadChance ?? 0.05
  const shift = () => {
    const r = random()
    return r < misread / 2 ? -1 : r < misread ? 1 : 0
  }
  // Minutes vary a little: nobody tests at the same second every day.
  const takenAt = new Date(t + Math.floor(random() * 40) * 60_000).toISOString()
  const ammonia = readKit(AMMONIA_KIT, state.ammoniaN, shift())
  const nitrite = readKit(NITRITE_KIT, state.nitriteN, shift())
  const nitrate = plan.stuckNitrateStep === undefined
    ? readKit(NITRATE_KIT, state.nitrateN, shift())
    : readKit(NITRATE_KIT, 0, plan.stuckNitrateStep)
  const noise = (size: number) => (random() - 0.5) * 2 * size
  const test: SimulatedTest = {
    day,
    takenAt,
    ammonia,
    nitrite,
    nitrate,
    ammoniaN: ammonia.valueN,
    nitriteN: nitrite.valueN,
    nitrateN: nitrate.valueN,
    pH: plan.pH ? round(plan.pH(day) + noise(0.04), 2) : pHFor(state.alkalinityDkh, noise(0.04)),
    temperatureC: round((plan.temperatureC?.(day) ?? 25.5) + noise(0.3), 1),
    salinity: round((plan.salinity?.(day) ?? 34.8) + noise(0.3), 1),
  }
  if (plan.reefChemistry) {
    test.alkalinityDkh = round(state.alkalinityDkh + noise(0.2), 1)
    test.calciumMgL = Math.round(420 + noise(10))
    test.magnesiumMgL = Math.round(1320 + noise(30))
  }
  if (plan.phosphateMgL) test.phosphateMgL = round(plan.phosphateMgL(day), 2)
  return test
}

/** Test ids: `r<day>-<hh>` (`r012-18`); event ids: `e<day>-<hh>-<kind>`. Stable, so tests can name them. */
function id(prefix: string, day: number, iso: string, suffix = ''): string {
  return `${prefix}${String(day).padStart(3, '0')}-${iso.slice(11, 13)}${suffix}`
}

/** The engine input for a simulated tank as of `now` (ISO), with optional company thresholds. */
export function simulationInput(sim: Simulation, now: string, thresholds?: Partial<Thresholds>): CycleInput {
  const readings: CycleReading[] = sim.tests.map((test) => {
    const reading: CycleReading = {
      id: id('r', test.day, test.takenAt),
      takenAt: test.takenAt,
      ammoniaN: test.ammoniaN,
      nitriteN: test.nitriteN,
      nitrateN: test.nitrateN,
      pH: test.pH,
      temperatureC: test.temperatureC,
      salinity: test.salinity,
    }
    if (test.alkalinityDkh !== undefined) reading.alkalinityDkh = test.alkalinityDkh
    if (test.calciumMgL !== undefined) reading.calciumMgL = test.calciumMgL
    if (test.magnesiumMgL !== undefined) reading.magnesiumMgL = test.magnesiumMgL
    if (test.phosphateMgL !== undefined) reading.phosphateMgL = test.phosphateMgL
    return reading
  })
  const events: CycleEvent[] = sim.events.map(e => ({
    id: id('e', e.day, e.at, `-${e.kind}`),
    at: e.at,
    kind: e.kind,
    ...(e.amount === undefined ? {} : { amount: e.amount }),
    ...(e.group === undefined ? {} : { group: e.group }),
  }))
  return {
    tank: { volumeLitres: sim.plan.volumeLitres ?? 300, cycleMethod: sim.plan.method, startedAt: sim.plan.start },
    readings,
    events,
    ...(thresholds ? { thresholds } : {}),
    now,
  }
}

/** ISO time of `day` at `hour` UTC from the plan's start. */
export function dayTime(sim: Simulation | SimulationPlan, day: number, hour = 20): string {
  const start = 'plan' in sim ? sim.plan.start : sim.start
  return new Date(Date.parse(start) + day * DAY_MS + hour * HOUR_MS).toISOString()
}
