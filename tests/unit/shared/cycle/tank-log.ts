/**
 * Builds realistic day-by-day tank histories for the cycle engine tests: one
 * morning test per day (as clients do), events at the hour they happen.
 */

import type { CycleEvent, CycleInput, CycleMethod, CycleReading, LivestockGroup, Thresholds } from '../../../../shared/cycle/types'

/** Tests start on this date; day n is START + n days. */
const START_MS = Date.UTC(2026, 2, 2, 0, 0, 0)

/** ISO time of `day` at `hour` UTC. */
export function at(day: number, hour = 9): string {
  return new Date(START_MS + day * 86_400_000 + hour * 3_600_000).toISOString()
}

/** One day's kit results, mg/L as N, plus optional water values. */
export interface DayTest {
  ammoniaN?: number
  nitriteN?: number
  nitrateN?: number
  pH?: number
  temperatureC?: number
  salinity?: number
  alkalinityDkh?: number
  calciumMgL?: number
  magnesiumMgL?: number
}

/** The water a healthy reef tank shows; scenarios override it where it matters. */
export const STEADY_WATER = { pH: 8.1, temperatureC: 25.5, salinity: 34 } as const

/** A tank's log: tests and events, turned into a CycleInput for a chosen moment. */
export class TankLog {
  readonly readings: CycleReading[] = []
  readonly events: CycleEvent[] = []

  constructor(readonly method: CycleMethod, readonly volumeLitres = 300) {}

  /** A test on `day` at `hour`; water values default to STEADY_WATER. */
  test(day: number, values: DayTest, hour = 9): this {
    this.readings.push({ id: `r${String(day).padStart(3, '0')}-${String(hour).padStart(2, '0')}`, takenAt: at(day, hour), ...STEADY_WATER, ...values })
    return this
  }

  /**
   * One morning test per day from `firstDay`, from parallel columns (mg/L as N);
   * `undefined` in a column means that value was not tested that day.
   */
  days(firstDay: number, columns: { ammonia: readonly (number | undefined)[], nitrite: readonly (number | undefined)[], nitrate?: readonly (number | undefined)[] }): this {
    columns.ammonia.forEach((ammoniaN, i) => {
      const values: DayTest = {}
      if (ammoniaN !== undefined) values.ammoniaN = ammoniaN
      const nitriteN = columns.nitrite[i]
      if (nitriteN !== undefined) values.nitriteN = nitriteN
      const nitrateN = columns.nitrate?.[i]
      if (nitrateN !== undefined) values.nitrateN = nitrateN
      this.test(firstDay + i, values)
    })
    return this
  }

  private event(kind: CycleEvent['kind'], day: number, hour: number, extra: Partial<CycleEvent> = {}): this {
    this.events.push({ id: `e${String(day).padStart(3, '0')}-${String(hour).padStart(2, '0')}-${kind}`, at: at(day, hour), kind, ...extra })
    return this
  }

  /** Ammonia dose, mg/L as N. */
  dose(day: number, amountN: number, hour = 10): this {
    return this.event('ammonia-dose', day, hour, { amount: amountN })
  }

  bacteria(day: number, hour = 10): this {
    return this.event('bacteria-dose', day, hour)
  }

  waterChange(day: number, litres: number, hour = 12): this {
    return this.event('water-change', day, hour, { amount: litres })
  }

  livestock(day: number, group: LivestockGroup, count = 3, hour = 14): this {
    return this.event('livestock-added', day, hour, { group, amount: count })
  }

  /** The engine input as of `day` at `hour`. */
  input(day: number, hour = 12, thresholds?: Partial<Thresholds>): CycleInput {
    return {
      tank: { volumeLitres: this.volumeLitres, cycleMethod: this.method, startedAt: at(0, 8) },
      readings: this.readings.map(r => ({ ...r })),
      events: this.events.map(e => ({ ...e })),
      ...(thresholds ? { thresholds } : {}),
      now: at(day, hour),
    }
  }
}

/** Rule ids of a verdict's findings. */
export function ruleIds(verdict: { findings: Array<{ ruleId: string }> }): string[] {
  return verdict.findings.map(f => f.ruleId)
}
