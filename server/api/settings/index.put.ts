import { and, eq, isNull } from 'drizzle-orm'
import { CompanySettingsUpdateSchema } from '#shared/schemas/settings'
import type { CompanySettingsSaved } from '#shared/types/settings'
import { tanks, tankVerdicts } from '../../db/schema'
import { saveCompanySettings } from '../../domain/settings/update'

/**
 * PUT /api/settings — saves the company's name and settings if the sent version is still
 * current (409 otherwise). Changed thresholds re-evaluate every tank of the company now.
 * Returns { name, settings, version, reevaluated: { tanks, phaseChanged } }.
 */
export default defineEventHandler(async (event): Promise<CompanySettingsSaved> => {
  const actor = await requireActor(event, ['admin'])
  const input = await readValidatedBody(event, valid(CompanySettingsUpdateSchema))
  const now = requestNow(event)
  const db = useDB()
  const result = saveCompanySettings(db, actor, input, now)
  if (!result.ok) throw createError({ statusCode: result.status, statusMessage: result.message })
  let reevaluated = { tanks: 0, phaseChanged: 0 }
  if (result.thresholdsChanged.length) {
    const rows = db.select({ id: tanks.id, phase: tankVerdicts.phase }).from(tanks).leftJoin(tankVerdicts, eq(tankVerdicts.tankId, tanks.id))
      .where(and(eq(tanks.organisationId, actor.organisationId), isNull(tanks.archivedAt))).all()
    for (const tank of rows) {
      const verdict = onTankDataChanged(tank.id, { now })
      reevaluated = { tanks: reevaluated.tanks + 1, phaseChanged: reevaluated.phaseChanged + (verdict && verdict.phase !== tank.phase ? 1 : 0) }
    }
  }
  return { ...result.view, reevaluated }
})
