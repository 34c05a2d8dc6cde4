import * as v from 'valibot'
import { resolveThresholds } from '#shared/cycle/thresholds'
import type { CyclePhase } from '#shared/cycle/types'
import type { ChartData } from '#shared/types/readings'
import { IdParams, isoTimeText } from '#shared/schemas/common'
import { readOrganisationSettings } from '#server/db/settings'
import { CHART_MAX_TESTS } from '#shared/readings/limits'
import { latestChartReadings, tankEvents } from '#server/domain/readings/current'

const ChartQuery = v.object({
  from: v.optional(isoTimeText('From must be a date.')),
  to: v.optional(isoTimeText('To must be a date.')),
})

/**
 * GET /api/tanks/:id/chart — the tank's current readings as compact parallel arrays (epoch
 * seconds, canonical values): the latest CHART_MAX_TESTS in the range, and whether it holds
 * older ones; its events from the first test drawn (all of the range when every test is
 * drawn); the current phase and the limits the charts draw. Returns ChartData.
 */
export default defineEventHandler(async (event): Promise<ChartData> => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const query = await getValidatedQuery(event, valid(ChartQuery))
  const db = useDB()
  // Current rows only: a corrected value is drawn once, as corrected.
  const { rows, older } = latestChartReadings(db, tank.id, query, CHART_MAX_TESTS)
  // A chart cut to its latest tests marks the events of the same span.
  const firstDrawn = older ? rows[0]?.[0] : undefined
  const eventRows = tankEvents(db, tank.id, { range: firstDrawn ? { ...query, from: firstDrawn } : query })
  const stored = await currentVerdictRow(tank.id, requestNow(event))
  const limits = resolveThresholds(readOrganisationSettings(db, tank.organisationId).thresholds)
  // Three significant decimals are far finer than any kit reads and keep the payload small.
  const r3 = (x: number | null) => (x === null ? null : Math.round(x * 1000) / 1000)
  return {
    t: rows.map(([takenAt]) => Math.round(Date.parse(takenAt) / 1000)),
    ammoniaN: rows.map(r => r3(r[1])),
    nitriteN: rows.map(r => r3(r[2])),
    nitrateN: rows.map(r => r3(r[3])),
    pH: rows.map(r => r3(r[4])),
    temperatureC: rows.map(r => r3(r[5])),
    salinity: rows.map(r => r3(r[6])),
    tests: { shown: rows.length, older },
    events: eventRows.map(e => ({ t: Math.round(Date.parse(e.at) / 1000), kind: e.kind, amount: r3(e.amount), group: e.group })),
    phase: (stored?.phase as CyclePhase | undefined) ?? 'not-started',
    completedOn: stored?.verdict.completedOn ?? null,
    limits: {
      ammoniaZeroN: limits.ammoniaZeroN, nitriteZeroN: limits.nitriteZeroN, riseN: limits.riseN, ammoniaActionN: limits.ammoniaActionN,
      salinityMin: limits.salinityMin, salinityMax: limits.salinityMax, temperatureMinC: limits.temperatureMinC, temperatureMaxC: limits.temperatureMaxC,
    },
  }
})
