/**
 * The demo tanks' histories, from the nitrification simulator (shared/cycle/simulate):
 * what the aquarist did and what the client's kits read each day, with the kit's own
 * basis kept as typed. Deterministic, so the demo looks the same on every seed.
 */
import { fishlessPlan, simulate, type Simulation, type SimulatedTest, type SimulationPlan } from '../../../shared/cycle/simulate'
import type { ReadingEntry } from '../../../shared/readings/entry'
import type { AmmoniaBasis, CycleEventKind, NitrateBasis, NitriteBasis } from '../../../shared/vocabulary'
import { eventColumns, readingColumns } from '../../domain/readings/columns'
import { checkedEvent, checkedReading } from './checked'

const DAY = 86_400_000

/** A reading row as the seed inserts it: what the test form would store. */
export type DemoReading = ReturnType<typeof readingColumns>

/** An event row as the seed inserts it: what the event form would store. */
export type DemoEvent = ReturnType<typeof eventColumns>

/** What the client typed for a simulated test: the kit's readings on their own bases. */
function typedEntry(test: SimulatedTest): ReadingEntry {
  return {
    takenAt: test.takenAt,
    ammonia: test.ammonia.value,
    nitrite: test.nitrite.value,
    nitrate: test.nitrate.value,
    basis: { ammonia: test.ammonia.basis as AmmoniaBasis, nitrite: test.nitrite.basis as NitriteBasis, nitrate: test.nitrate.basis as NitrateBasis },
    pH: test.pH,
    temperature: test.temperatureC,
    temperatureUnit: 'C',
    salinity: test.salinity,
    salinityMode: 'practical',
    alkalinityDkh: test.alkalinityDkh ?? null,
    calciumMgL: test.calciumMgL ?? null,
    magnesiumMgL: test.magnesiumMgL ?? null,
    phosphateMgL: test.phosphateMgL ?? null,
  }
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

/**
 * The simulated history's tests and events no later than `notAfter`, as seed rows, each
 * through the same rules as the test and event forms (a value they would refuse throws).
 * Doses are logged in mg/L as N, water changes in litres; `notes` gives each kind its note.
 */
export function demoHistory(sim: Simulation, notAfter: Date, notes: Partial<Record<CycleEventKind, string>> = {}): { readings: DemoReading[], events: DemoEvent[] } {
  const limit = notAfter.toISOString()
  const readings = sim.tests.filter(t => t.takenAt <= limit).map(t => readingColumns(checkedReading(typedEntry(t), notAfter)))
  const events = sim.events.filter(e => e.at <= limit).map(e => eventColumns(checkedEvent({
    at: e.at,
    kind: e.kind,
    amount: e.amount ?? null,
    doseBasis: 'N',
    volumeUnit: 'L',
    group: e.group ?? null,
    notes: notes[e.kind] ?? null,
  }, notAfter)))
  return { readings, events }
}

export { simulate }
