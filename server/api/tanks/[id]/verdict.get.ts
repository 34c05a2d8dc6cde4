import { eq, inArray } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import { ruleInfo } from '#shared/cycle/registry'
import type { Verdict } from '#shared/cycle/types'
import type { VerdictView } from '#shared/types/readings'
import { readings, tankVerdicts } from '../../../db/schema'

/**
 * GET /api/tanks/:id/verdict — the stored verdict of the rule engine (evaluated now if
 * none is stored), with each cited rule's description and source and the readings the
 * findings rest on. Returns VerdictView.
 */
export default defineEventHandler(async (event): Promise<VerdictView> => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const db = useDB()
  let stored = db.select().from(tankVerdicts).where(eq(tankVerdicts.tankId, tank.id)).get()
  if (!stored) {
    refreshVerdict(tank.id)
    stored = db.select().from(tankVerdicts).where(eq(tankVerdicts.tankId, tank.id)).get()
  }
  if (!stored) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  const verdict = stored.verdict as unknown as Verdict
  const ruleIds = new Set(verdict.findings.map(f => f.ruleId))
  const rules: VerdictView['rules'] = {}
  for (const ruleId of ruleIds) {
    const info = ruleInfo(ruleId)
    if (info) rules[ruleId] = { id: info.id, description: info.description, source: info.source }
  }
  const readingIds = [...new Set(verdict.findings.flatMap(f => f.readingIds))]
  const rows = readingIds.length
    ? db.select({ id: readings.id, takenAt: readings.takenAt, ammoniaN: readings.ammoniaN, nitriteN: readings.nitriteN, nitrateN: readings.nitrateN })
        .from(readings).where(inArray(readings.id, readingIds.slice(0, 500))).all()
    : []
  return { verdict, evaluatedAt: stored.evaluatedAt, rules, readings: Object.fromEntries(rows.map(r => [r.id, r])) }
})
