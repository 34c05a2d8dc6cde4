/**
 * The catalogue of simulated tanks the rule sets are judged on: at least one per item of
 * rule set 2 that concerns judgement, each with what an experienced aquarist would decide at
 * the cut and why, in words (`aquarist`) and as data the test checks (`expect`). Some tanks
 * must wait; others are genuinely cycled and must not be blocked. The unit test
 * (tests/unit/shared/cycle/simulate/catalogue.test.ts), the agreement table
 * (`npm run scenarios`) and forecast back-tests share it.
 */

import { fromNitrogen, toNitrogen } from '../../chemistry/nitrogen'
import { LIVESTOCK_GROUPS } from '../../vocabulary'
import type { CycleInput, CycleReading } from '../types'
import type { AquaristCall } from './agreement'
import { dailyDoses, DOSE_2PPM_N, fishlessPlan, spacedDoses } from './plans'
import { dayTime, simulate, simulationInput, type PlannedWaterChange, type SimulationPlan } from './simulate'

/** One judged tank. */
export interface Scenario {
  readonly id: string
  /** The item of the issue it exercises. */
  readonly item: string
  /** What an experienced aquarist would decide, and why. */
  readonly aquarist: string
  /** The same decision as checks on the verdict. */
  readonly expect: AquaristCall
  readonly plan: SimulationPlan
  /** The moment the verdict is for: day and hour from the plan's start. */
  readonly at: { day: number, hour: number }
  /** A change to the input the simulator cannot express (a same-minute test, a stored reading). */
  readonly tweak?: (input: CycleInput) => CycleInput
  /**
   * Why the current rule set still disagrees, when it does: the test then requires the
   * disagreement (so fixing it forces this note off) and the table shows it.
   */
  readonly open?: string
}

const START = '2026-03-02T00:00:00.000Z'
const when = (day: number, hour: number) => dayTime({ start: START } as SimulationPlan, day, hour)
/** A weekly partial water change, as most aquarists keep a stocked tank (common practice, no published source). */
const weekly = (fromDay: number, toDay: number, percent = 25): PlannedWaterChange[] =>
  Array.from({ length: Math.floor((toDay - fromDay) / 7) + 1 }, (_, i) => ({ day: fromDay + i * 7, hour: 12, percent }))
const fishIn = (seed: number, days: number, over: Partial<SimulationPlan> = {}): SimulationPlan => ({
  seed, start: START, days, method: 'fish-in', seeding: 'bottled', testHour: 8,
  livestock: [{ day: 0, hour: 7, group: 'fish', count: 3, loadNPerDay: 0.2 }], waterChanges: weekly(6, days - 1), ...over,
})
const reef = { reefChemistry: true } as const
/** Fishless cycle proven by daily doses to day 33, then two half changes of the high nitrate on days 34 and 35. */
const fishlessChanged = (seed: number, over: Partial<SimulationPlan> = {}): SimulationPlan => ({
  ...fishlessPlan({ seed, start: START, days: 37, proofToDay: 34 }),
  waterChanges: [{ day: 35, hour: 10, percent: 50 }, { day: 35, hour: 15, percent: 50 }],
  extraTests: [...(fishlessPlan({ seed, start: START, days: 37, proofToDay: 34 }).extraTests ?? []), { day: 35, hour: 14 }],
  ...over,
})
/** A test typed by hand: the same conditions as a steady reef tank. */
const typed = (id: string, day: number, hour: number, values: Partial<CycleReading>, enteredHour = hour): CycleReading =>
  ({ id, takenAt: when(day, hour), enteredAt: when(day, enteredHour), nitriteN: 0, pH: 8.1, temperatureC: 25.5, salinity: 35, ...values })
const withTests = (...tests: CycleReading[]) => (input: CycleInput): CycleInput => ({ ...input, readings: [...input.readings, ...tests] })
/**
 * 0.5 ppm as NH3 as the form stores it, and the same reading after a CSV import's conversion
 * through another basis (as NH4), landing one bit above: floating-point conversions can land
 * either side of a limit, and the engine must judge both the same.
 */
const HALF_PPM_FORM_N = toNitrogen(0.5, 'NH3')
const HALF_PPM_CSV_N = toNitrogen(fromNitrogen(HALF_PPM_FORM_N, 'NH4'), 'NH4') * (1 + Number.EPSILON)

/** A reef tank with few fish, kept low in nitrate, whose cycle completes on day 27: LPS may go in from day 57 08:33. */
const lpsWaitPlan = fishIn(29, 57, { ...reef, livestock: [{ day: 0, hour: 7, group: 'fish', count: 2, loadNPerDay: 0.1 }], waterChanges: weekly(6, 56, 30) })

// The groups by name, from the one list (shared/vocabulary.ts), in its order.
const [FISH, INVERTEBRATES, SOFT, LPS, SPS] = LIVESTOCK_GROUPS
const CORALS = [SOFT, LPS, SPS] as const
const ALL = LIVESTOCK_GROUPS
const STONY = [LPS, SPS] as const

/** Every scenario, in the order of the items. */
export const SCENARIOS: readonly Scenario[] = [
  {
    id: 'same-minute-tests',
    item: '1 order',
    aquarist: 'Two tests saved in the same minute: the one entered last (ammonia 1 ppm with fish in) is the one that counts, whatever its id; change water now and re-test.',
    expect: { complete: false, says: [{ rule: 'ammonia.action-threshold', severity: 'danger' }], actions: ['water-change', 'retest'], waterChangeAtMostPercent: 50, blocked: ALL },
    plan: fishIn(31, 30),
    at: { day: 29, hour: 12 },
    tweak: withTests(typed('0-entered-last', 29, 10, { ammoniaN: 0.82 }, 10.1), typed('z-entered-first', 29, 10, { ammoniaN: 0 }, 10.05)),
  },
  {
    id: 'one-dose-overnight-live-rock',
    item: '2 fishless proof',
    aquarist: 'Live rock and one dose cleared overnight, then zeros: not proof. Dose daily for three days and watch each clear before calling it cycled.',
    expect: { complete: false, phases: ['settling'], says: [{ rule: 'cycle.clearance-test' }], actions: ['clearance-test'], blocked: ALL },
    plan: { seed: 2, start: START, days: 6, method: 'fishless', seeding: 'live-rock', doses: [{ day: 0, hour: 10, amountN: DOSE_2PPM_N }], testHour: 18 },
    at: { day: 5, hour: 20 },
  },
  {
    id: 'one-dose-overnight-bottled',
    item: '2 fishless proof',
    aquarist: 'A strong bottled-bacteria product and one 2 ppm dose gone by the next evening, then four days of zeros: the label says cycled, nobody who has lost fish would. Dose daily for three days first.',
    expect: { complete: false, phases: ['settling'], says: [{ rule: 'cycle.clearance-test' }], actions: ['clearance-test'], blocked: ALL },
    plan: { seed: 21, start: START, days: 6, method: 'fishless', seeding: 'bottled', seedCapacityN: 2.5, doses: [{ day: 0, hour: 11, amountN: DOSE_2PPM_N }], testHour: 18 },
    at: { day: 5, hour: 20 },
  },
  {
    id: 'doses-without-amount',
    item: '2 fishless proof',
    aquarist: 'Daily doses logged without amounts: nobody knows what was cleared, so it is not proof yet. Log the amount of the next doses.',
    expect: { complete: false, phases: ['settling'], blocked: ALL, says: [{ rule: 'cycle.clearance-failed', words: 'amount' }] },
    plan: { ...fishlessPlan({ seed: 3, start: START, days: 36 }), doses: fishlessPlan({ seed: 3, start: START, days: 36 }).doses?.map(d => (d.day >= 24 ? { ...d, logAmount: false } : d)) },
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'fishless-textbook',
    item: '2 fishless proof (must not block)',
    aquarist: 'Bottled bacteria, about 2 ppm daily once nitrite is gone, each dose gone by the next evening for days, then two half water changes for the nitrate: cycled. Fish, invertebrates and soft corals may go in; stony corals wait for time and tested chemistry.',
    expect: { complete: true, phases: ['complete'], allowed: [FISH, INVERTEBRATES, SOFT], blocked: STONY },
    plan: fishlessChanged(7),
    at: { day: 35, hour: 20 },
  },
  {
    id: 'fishless-trace-after-proof',
    item: '2 fishless proof',
    aquarist: 'Proven on day 32, but today\'s test shows a trace of nitrite: re-test in a few hours before anything goes in; if it reads zero the completion stands.',
    expect: { complete: false, phases: ['settling'], actions: ['retest'], blocked: ALL },
    plan: fishlessPlan({ seed: 7, start: START, days: 36 }),
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'fish-in-nitrite-stage',
    item: '3 fish-in proof (must not block)',
    aquarist: 'Three fish, an ammonia and a nitrite stage, weekly water changes, then well over a week of zeros on daily tests: cycled for the load it carries. A few more fish and soft corals may follow; stony corals wait.',
    expect: { complete: true, phases: ['complete'], allowed: [FISH, INVERTEBRATES, SOFT], blocked: STONY },
    plan: fishIn(5, 40),
    at: { day: 39, hour: 12 },
  },
  {
    id: 'fish-in-too-soon',
    item: '3 fish-in proof',
    aquarist: 'Three fish, nitrite only just gone to zero three days ago: a fish-in tank needs a week of zeros before anything more goes in.',
    expect: { complete: false, blocked: ALL },
    plan: fishIn(5, 40),
    at: { day: 21, hour: 12 },
  },
  {
    id: 'fish-in-seeded',
    item: '3 fish-in proof (must not block)',
    aquarist: 'Live rock carried the fish from day one: no ammonia or nitrite ever showed, nitrate has risen for weeks under their load. It is cycled; blocking it forever would be wrong.',
    expect: { complete: true, phases: ['complete'], allowed: [FISH, INVERTEBRATES, SOFT], blocked: STONY },
    plan: fishIn(6, 30, { seeding: 'live-rock', waterChanges: weekly(13, 29) }),
    at: { day: 29, hour: 12 },
  },
  {
    id: 'stall-low-alkalinity',
    item: '4 stall',
    aquarist: 'Daily doses with nobody topping up alkalinity: ammonia sits high and nitrate stops rising. A stall: check alkalinity and pH, stop dosing.',
    expect: { complete: false, says: [{ rule: 'cycle.stalled' }], actions: ['check-stall'], blocked: ALL },
    plan: { seed: 8, start: START, days: 40, method: 'fishless', seeding: 'bottled', buffered: false, doses: dailyDoses(0, 39, DOSE_2PPM_N), testHour: 18 },
    at: { day: 39, hour: 20 },
  },
  {
    id: 'nitrite-off-the-kit-nitrate-climbing',
    item: '4 stall',
    aquarist: 'Nitrite off the top of the kit for two weeks, but nitrate climbing: the bacteria are working. Not a stall; lower the dose.',
    expect: { complete: false, phases: ['nitrite'], neverSays: ['cycle.stalled'], says: [{ rule: 'dosing.lower' }], blocked: ALL },
    plan: { seed: 9, start: START, days: 24, method: 'fishless', seeding: 'bottled', doses: dailyDoses(0, 23, 2 * DOSE_2PPM_N), testHour: 18 },
    at: { day: 23, hour: 20 },
  },
  {
    id: 'high-nitrate-after-fishless',
    item: '5 gates: nitrate',
    aquarist: 'Cycled after weeks of daily doses, nitrate about 80 ppm as NO3: change water, at most half at a time, before the fish go in.',
    expect: { complete: true, blocked: ALL, says: [{ rule: 'water-change.before-stocking' }], actions: ['water-change'], waterChangeAtMostPercent: 50 },
    plan: fishlessPlan({ seed: 10, start: START, days: 40 }),
    at: { day: 39, hour: 18.7 },
  },
  {
    id: 'phosphate-high',
    item: '5 gates: phosphate',
    aquarist: 'Cycled and the nitrate changed out, but phosphate reads 0.5 ppm from the rock: fish may go in, corals wait until phosphate is down.',
    expect: { complete: true, allowed: [FISH, INVERTEBRATES], blocked: CORALS },
    plan: fishlessChanged(22, { phosphateMgL: () => 0.5 }),
    at: { day: 35, hour: 20 },
  },
  {
    id: 'ph-low',
    item: '5 gates: pH',
    aquarist: 'Cycled, but pH reads 7.6 for days (a closed room full of CO2): a caution, and nothing goes in until pH is back in the reef range.',
    expect: { complete: true, blocked: ALL, says: [{ rule: 'ph.range', severity: 'caution' }] },
    plan: fishlessChanged(23, { pH: day => (day >= 30 ? 7.6 : 8.1) }),
    at: { day: 36, hour: 20 },
  },
  {
    id: 'stony-untested-chemistry',
    item: '5 gates: stony corals, untested chemistry',
    aquarist: 'Cycled two months ago, but alkalinity, calcium and magnesium never tested: no stony corals on a guess; fish and soft corals are fine.',
    expect: { complete: true, allowed: [FISH, SOFT], blocked: STONY },
    plan: fishIn(12, 70),
    at: { day: 69, hour: 12 },
  },
  {
    id: 'natural-seawater-lps-before-sps',
    item: '5 gates: natural seawater, SPS later than LPS (must not block)',
    aquarist: 'Natural seawater steady at about 35.3, chemistry tested and in range, weekly changes, cycled well over a month ago: LPS may go in; SPS waits months longer.',
    expect: { complete: true, allowed: [FISH, INVERTEBRATES, SOFT, LPS], blocked: ['sps-coral'] },
    plan: fishIn(13, 75, { ...reef, salinity: () => 35.3, livestock: [{ day: 0, hour: 7, group: 'fish', count: 2, loadNPerDay: 0.1 }], waterChanges: weekly(6, 74, 30) }),
    at: { day: 74, hour: 12 },
  },
  {
    id: 'large-addition',
    item: '5 gates: stocking rate',
    aquarist: 'Eight fish at once into a tank cycled for three: more fish wait two weeks, test daily.',
    expect: { blocked: ['fish'], says: [{ rule: 'livestock.stocking-rate' }], actions: ['retest'] },
    plan: fishIn(14, 40, { livestock: [{ day: 0, hour: 7, group: 'fish', count: 3, loadNPerDay: 0.35 }, { day: 37, hour: 14, group: 'fish', count: 8, loadNPerDay: 0.9 }] }),
    at: { day: 39, hour: 12 },
  },
  {
    id: 'cycled-left-unfed',
    item: '5 gates: keep feeding',
    aquarist: 'Proven and changed, then left five days with no dose and no animals: still cycled, but dose ammonia now or the bacteria starve.',
    expect: { complete: true, says: [{ rule: 'cycle.keep-feeding' }] },
    plan: { ...fishlessChanged(24), days: 40 },
    at: { day: 39, hour: 20 },
  },
  {
    id: 'nitrate-kit-dead',
    item: '5 gates: nitrate kit that never moves',
    aquarist: 'Doses clear every day but nitrate reads 5 ppm for a fortnight: the nitrate kit is dead, not the cycle. Test with a fresh kit before calling it.',
    expect: { complete: false, phases: ['settling'], says: [{ rule: 'testing.nitrate-kit' }], blocked: ALL },
    plan: { ...fishlessPlan({ seed: 17, start: START, days: 36 }), stuckNitrateStep: 1 },
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'temperature-danger',
    item: '6 hard limits',
    aquarist: 'A heater stuck on: 31 C with fish in is an emergency, whatever the cycle says.',
    expect: { says: [{ rule: 'temperature.range', severity: 'danger' }], blocked: ALL },
    plan: fishIn(15, 30, { temperatureC: day => (day >= 28 ? 31.2 : 25.5) }),
    at: { day: 29, hour: 12 },
  },
  {
    id: 'salinity-danger',
    item: '6 hard limits',
    aquarist: 'Top-off failed for a week: salinity 38 with fish in is an emergency; bring it down slowly.',
    expect: { says: [{ rule: 'salinity.range', severity: 'danger' }], blocked: ALL },
    plan: fishIn(25, 30, { salinity: day => (day >= 27 ? 38.2 : 35) }),
    at: { day: 29, hour: 12 },
  },
  {
    id: 'nitrite-top-of-kit-with-fish',
    item: '6 hard limits',
    aquarist: 'Six fish in an unseeded tank, nitrite at the top colour of the kit (5 ppm as NO2 or more): an emergency, change water now.',
    expect: { complete: false, says: [{ rule: 'nitrite.high-with-animals', severity: 'danger' }], actions: ['water-change'], waterChangeAtMostPercent: 50 },
    plan: fishIn(26, 22, { seeding: 'none', livestock: [{ day: 0, hour: 7, group: 'fish', count: 6, loadNPerDay: 0.9 }], waterChanges: [] }),
    at: { day: 21, hour: 12 },
  },
  {
    id: 'chronic-free-ammonia',
    item: '6 hard limits: EPA chronic over 4 days',
    aquarist: 'Fish-in with ammonia at 0.5 ppm for four days at pH 8.3: toxic ammonia above the long-term limit all that time. Change water now.',
    expect: { complete: false, says: [{ rule: 'ammonia.free-chronic-average', severity: 'danger' }], actions: ['water-change'], waterChangeAtMostPercent: 50 },
    plan: fishIn(16, 12, { livestock: [{ day: 0, hour: 7, group: 'fish', count: 6, loadNPerDay: 0.7 }], buffered: true, alkalinityDkh: 11, waterChanges: [] }),
    at: { day: 11, hour: 12 },
  },
  {
    id: 'water-change-at-most-half',
    item: '7 water changes',
    aquarist: 'Ammonia 4 ppm with fish in: more than half the water would have to go at once. Change half, re-test, and change again.',
    expect: { complete: false, says: [{ rule: 'ammonia.action-threshold', severity: 'danger' }], actions: ['water-change', 'retest'], waterChangeAtMostPercent: 50 },
    plan: fishIn(27, 10),
    at: { day: 9, hour: 12 },
    tweak: withTests(typed('high-ammonia', 9, 10, { ammoniaN: toNitrogen(4, 'NH3') })),
  },
  {
    id: 'kit-boundary-form',
    item: '8 boundaries',
    aquarist: 'Cycled fish-in tank, one test reads 0.5 ppm ammonia as NH3 (typed in the form): not above the 0.5 ppm action level, so no emergency; re-test tomorrow.',
    expect: { neverSays: ['ammonia.action-threshold'] },
    plan: fishIn(28, 30),
    at: { day: 29, hour: 12 },
    tweak: withTests(typed('half-ppm', 29, 10, { ammoniaN: HALF_PPM_FORM_N })),
  },
  {
    id: 'kit-boundary-csv',
    item: '8 boundaries',
    aquarist: 'The same 0.5 ppm imported by CSV in another basis: judged exactly as the form\'s.',
    expect: { neverSays: ['ammonia.action-threshold'] },
    plan: fishIn(28, 30),
    at: { day: 29, hour: 12 },
    tweak: withTests(typed('half-ppm', 29, 10, { ammoniaN: HALF_PPM_CSV_N })),
  },
  {
    id: 'time-alone-missed-tests',
    item: '9 time alone',
    aquarist: 'Mid-cycle and the client stopped testing three days ago: the verdict must say so without any new reading.',
    expect: { complete: false, says: [{ rule: 'testing.overdue' }], actions: ['test-now'] },
    plan: { ...fishlessPlan({ seed: 18, start: START, days: 15 }) },
    at: { day: 17, hour: 20 },
  },
  {
    id: 'time-alone-lps-wait-runs',
    item: '9 time alone',
    aquarist: 'A reef tank cycled 29 days ago (day 27) with chemistry in range: the LPS wait has a few hours to run, so LPS still wait.',
    expect: { complete: true, allowed: [FISH, SOFT], blocked: STONY },
    plan: lpsWaitPlan,
    at: { day: 56, hour: 12 },
  },
  {
    id: 'time-alone-lps-wait-ends',
    item: '9 time alone (must not block)',
    aquarist: 'The same tank a day later, no new test: the LPS wait has run out, so LPS may go in now; SPS waits months longer.',
    expect: { complete: true, allowed: [FISH, SOFT, LPS], blocked: ['sps-coral'] },
    plan: lpsWaitPlan,
    at: { day: 57, hour: 12 },
  },
  {
    id: 'stall-by-time-alone',
    item: '9 time alone',
    aquarist: 'Nitrite stuck high and flat for two weeks with nitrate not moving: a stall, and it stays one while no test arrives.',
    expect: { complete: false, says: [{ rule: 'cycle.stalled' }] },
    plan: { seed: 30, start: START, days: 36, method: 'fishless', seeding: 'bottled', buffered: false, alkalinityDkh: 6, doses: spacedDoses(0, 35, 2, DOSE_2PPM_N), testHour: 18 },
    at: { day: 36, hour: 20 },
  },
]

/** The engine input of a scenario at its moment. */
export function scenarioInput(scenario: Scenario): CycleInput {
  const input = simulationInput(simulate(scenario.plan), dayTime(scenario.plan, scenario.at.day, scenario.at.hour))
  return scenario.tweak ? scenario.tweak(input) : input
}
