/**
 * The catalogue of simulated tanks the rule sets are judged on: one per rule of rule
 * set 2, each with what an experienced aquarist would decide and why. Scenario tests,
 * the before/after table (scripts/cycle-scenarios.ts) and forecast back-tests share it.
 */

import type { CycleInput } from '../types'
import { dailyDoses, DOSE_2PPM_N, fishlessPlan } from './plans'
import { dayTime, simulate, simulationInput, type SimulationPlan } from './simulate'

/** One judged tank. */
export interface Scenario {
  readonly id: string
  /** What an experienced aquarist would decide, and why. */
  readonly aquarist: string
  readonly plan: SimulationPlan
  /** The moment the verdict is for: day and hour from the plan's start. */
  readonly at: { day: number, hour: number }
  /** A change to the input the simulator cannot express (a same-minute test, a stored reading). */
  readonly tweak?: (input: CycleInput) => CycleInput
}

const START = '2026-03-02T00:00:00.000Z'
const fishIn = (seed: number, days: number, over: Partial<SimulationPlan> = {}): SimulationPlan => ({
  seed, start: START, days, method: 'fish-in', seeding: 'bottled', testHour: 8,
  livestock: [{ day: 0, hour: 7, group: 'fish', count: 3, loadNPerDay: 0.35 }], ...over,
})
const reef = { reefChemistry: true } as const

/** Every scenario, in the order of the rules they exercise. */
export const SCENARIOS: readonly Scenario[] = [
  {
    id: 'same-minute-tests',
    aquarist: 'Two tests saved in the same minute: the one entered last (ammonia 1 ppm with fish in) is the one that counts; act on it.',
    plan: fishIn(31, 30),
    at: { day: 29, hour: 12 },
    tweak: input => ({
      ...input,
      readings: [
        ...input.readings,
        { id: 'a-first', takenAt: dayTime({ start: START } as SimulationPlan, 29, 10), enteredAt: dayTime({ start: START } as SimulationPlan, 29, 10.1), ammoniaN: 0.82, nitriteN: 0, pH: 8.1, temperatureC: 25.5, salinity: 35 },
        { id: '0-second', takenAt: dayTime({ start: START } as SimulationPlan, 29, 10), enteredAt: dayTime({ start: START } as SimulationPlan, 29, 10.05), ammoniaN: 0, nitriteN: 0, pH: 8.1, temperatureC: 25.5, salinity: 35 },
      ],
    }),
  },
  {
    id: 'one-dose-overnight',
    aquarist: 'Live rock and one dose cleared overnight, then zeros: not proof. Dose daily for three days and watch each clear before calling it cycled.',
    plan: { seed: 2, start: START, days: 6, method: 'fishless', seeding: 'live-rock', doses: [{ day: 0, hour: 10, amountN: DOSE_2PPM_N }], testHour: 18 },
    at: { day: 5, hour: 20 },
  },
  {
    id: 'doses-without-amount',
    aquarist: 'Daily doses logged without amounts: nobody knows what was cleared, so it is not proof yet.',
    plan: { ...fishlessPlan({ seed: 3, start: START, days: 36 }), doses: fishlessPlan({ seed: 3, start: START, days: 36 }).doses?.map(d => (d.day >= 24 ? { ...d, logAmount: false } : d)) },
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'fishless-textbook',
    aquarist: 'Bottled bacteria, about 2 ppm daily once nitrite is gone, each dose gone by the next evening for days: cycled.',
    plan: fishlessPlan({ seed: 7, start: START, days: 36 }),
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'fish-in-nitrite-stage',
    aquarist: 'Three fish, an ammonia and a nitrite stage, then a week of zeros on daily tests: cycled for the load it carries.',
    plan: fishIn(5, 40),
    at: { day: 39, hour: 12 },
  },
  {
    id: 'fish-in-seeded',
    aquarist: 'Live rock carried the fish from day one: no ammonia or nitrite ever showed, nitrate has risen for weeks. It is cycled; blocking it forever would be wrong.',
    plan: fishIn(6, 30, { seeding: 'live-rock' }),
    at: { day: 29, hour: 12 },
  },
  {
    id: 'stall-low-alkalinity',
    aquarist: 'Daily doses with nobody topping up alkalinity: ammonia sits high and nitrate stops rising. A stall: check alkalinity and pH, stop dosing.',
    plan: { seed: 8, start: START, days: 40, method: 'fishless', seeding: 'bottled', buffered: false, doses: dailyDoses(0, 39, DOSE_2PPM_N), testHour: 18 },
    at: { day: 39, hour: 20 },
  },
  {
    id: 'nitrite-off-the-kit-nitrate-climbing',
    aquarist: 'Nitrite off the top of the kit for two weeks, but nitrate climbing: the bacteria are working. Not a stall; lower the dose.',
    plan: { seed: 9, start: START, days: 24, method: 'fishless', seeding: 'bottled', doses: dailyDoses(0, 23, 2 * DOSE_2PPM_N), testHour: 18 },
    at: { day: 23, hour: 20 },
  },
  {
    id: 'high-nitrate-after-fishless',
    aquarist: 'Cycled after weeks of daily doses, nitrate about 80 ppm as NO3: change water before the fish go in.',
    plan: fishlessPlan({ seed: 10, start: START, days: 40 }),
    at: { day: 39, hour: 18.7 },
  },
  {
    id: 'stony-untested-chemistry',
    aquarist: 'Cycled two months ago, but alkalinity, calcium and magnesium never tested: no stony corals on a guess.',
    plan: fishIn(12, 70),
    at: { day: 69, hour: 12 },
  },
  {
    id: 'natural-seawater-salinity',
    aquarist: 'Salinity steady at about 35.3, natural seawater, chemistry in range, two months after completion: LPS may go in, SPS waits longer.',
    plan: fishIn(13, 75, { ...reef, salinity: () => 35.3 }),
    at: { day: 74, hour: 12 },
  },
  {
    id: 'large-addition',
    aquarist: 'Eight fish at once into a tank cycled for three: more fish wait two weeks, test daily.',
    plan: fishIn(14, 40, { livestock: [{ day: 0, hour: 7, group: 'fish', count: 3, loadNPerDay: 0.35 }, { day: 37, hour: 14, group: 'fish', count: 8, loadNPerDay: 0.9 }] }),
    at: { day: 39, hour: 12 },
  },
  {
    id: 'temperature-danger',
    aquarist: 'A heater stuck on: 31 C with fish in is an emergency, whatever the cycle says.',
    plan: fishIn(15, 30, { temperatureC: day => (day >= 28 ? 31.2 : 25.5) }),
    at: { day: 29, hour: 12 },
  },
  {
    id: 'chronic-free-ammonia',
    aquarist: 'Fish-in with ammonia at 0.5 ppm for four days at pH 8.3: toxic ammonia above the long-term limit all that time. Change water now.',
    plan: fishIn(16, 12, { livestock: [{ day: 0, hour: 7, group: 'fish', count: 6, loadNPerDay: 0.7 }], buffered: true, alkalinityDkh: 11 }),
    at: { day: 11, hour: 12 },
  },
  {
    id: 'nitrate-kit-dead',
    aquarist: 'Doses clear every day but nitrate reads 5 ppm for a fortnight: the nitrate kit is dead, not the cycle.',
    plan: { ...fishlessPlan({ seed: 17, start: START, days: 36 }), stuckNitrateStep: 1 },
    at: { day: 35, hour: 18.7 },
  },
  {
    id: 'time-alone-missed-tests',
    aquarist: 'Mid-cycle and the client stopped testing three days ago: the verdict must say so without any new reading.',
    plan: { ...fishlessPlan({ seed: 18, start: START, days: 15 }) },
    at: { day: 17, hour: 20 },
  },
]

/** The engine input of a scenario at its moment. */
export function scenarioInput(scenario: Scenario): CycleInput {
  const input = simulationInput(simulate(scenario.plan), dayTime(scenario.plan, scenario.at.day, scenario.at.hour))
  return scenario.tweak ? scenario.tweak(input) : input
}
