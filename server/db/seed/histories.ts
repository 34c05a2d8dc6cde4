/**
 * The demo tanks' histories, from the nitrification simulator (shared/cycle/simulate):
 * what the aquarist did and what the client's kits read each day, with the kit's own
 * basis kept as typed. Deterministic, so the demo looks the same on every seed.
 */
import { fishlessPlan, simulate, type Simulation, type SimulationPlan } from '../../../shared/cycle/simulate'
import type { CycleEventKind } from '../../../shared/vocabulary'

const DAY = 86_400_000

/** A reading row as the seed inserts it: canonical values plus what was typed. */
export interface DemoReading {
  takenAt: string
  ammoniaN: number
  nitriteN: number
  nitrateN: number
  pH: number
  temperatureC: number
  salinity: number
  entered: Record<string, unknown>
}

/** An event row as the seed inserts it. */
export interface DemoEvent {
  at: string
  kind: CycleEventKind
  amount?: number
  group?: 'fish'
}

/** Midnight UTC of the day `days` before `now`: day 0 of a history. */
export function historyStart(now: Date, days: number): string {
  const d = new Date(now.getTime() - days * DAY)
  d.setUTCHours(0, 0, 0, 0)
  return d.toISOString()
}

/** Lounge reef, fishless, day 12: bottled bacteria and a dose, now in the nitrite stage. */
export function loungePlan(now: Date): SimulationPlan {
  return fishlessPlan({ seed: 7, start: historyStart(now, 12), days: 12, testHour: 18, skipDays: [4] })
}

/** Quay Street nano, fishless, day 34: daily doses of about 2 ppm cleared since day 28 and proven; awaiting sign-off. */
export function nanoPlan(now: Date): SimulationPlan {
  return fishlessPlan({ seed: 11, start: historyStart(now, 34), days: 34, testHour: 19, proofFromDay: 24, proofToDay: 32 })
}

/** Fernhill study reef, fish-in with three damselfish: heavy feeding over the weekend sends ammonia past the action level. */
export function studyPlan(now: Date): SimulationPlan {
  return {
    seed: 23,
    start: historyStart(now, 9),
    days: 10,
    volumeLitres: 202,
    method: 'fish-in',
    seeding: 'bottled',
    bacteriaAt: { day: 0, hour: 11 },
    testHour: 8,
    livestock: [{ day: 0, hour: 12, group: 'fish', count: 3, loadNPerDay: 0.03 }],
    // Uneaten food nobody logs: the ammonia the fish-in bacteria cannot yet keep up with.
    doses: [{ day: 7, hour: 19, amountN: 0.7, logged: false }, { day: 8, hour: 19, amountN: 0.5, logged: false }],
  }
}

/** The simulated history's tests and events no later than `notAfter`, as seed rows. */
export function demoHistory(sim: Simulation, notAfter: Date): { readings: DemoReading[], events: DemoEvent[] } {
  const limit = notAfter.toISOString()
  const readings = sim.tests.filter(t => t.takenAt <= limit).map(t => ({
    takenAt: t.takenAt,
    ammoniaN: t.ammoniaN,
    nitriteN: t.nitriteN,
    nitrateN: t.nitrateN,
    pH: t.pH,
    temperatureC: t.temperatureC,
    salinity: t.salinity,
    entered: {
      ammonia: { value: t.ammonia.value, basis: t.ammonia.basis },
      nitrite: { value: t.nitrite.value, basis: t.nitrite.basis },
      nitrate: { value: t.nitrate.value, basis: t.nitrate.basis },
      pH: t.pH,
      temperature: { value: t.temperatureC, unit: 'C' },
      salinity: { value: t.salinity, as: 'practical' },
    },
  }))
  const events = sim.events.filter(e => e.at <= limit).map(e => ({
    at: e.at,
    kind: e.kind,
    ...(e.amount === undefined ? {} : { amount: e.amount }),
    ...(e.group === 'fish' ? { group: 'fish' as const } : {}),
  }))
  return { readings, events }
}

export { simulate }
