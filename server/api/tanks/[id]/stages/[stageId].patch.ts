import { eq } from 'drizzle-orm'
import { StageParams, StagePatchSchema } from '#shared/schemas/plan'
import { planStages } from '../../../../db/schema'

/**
 * PATCH /api/tanks/:id/stages/:stageId — changes a stage's status, ticks, notes or helper values.
 * Starting a stage moves a planned tank to building; finishing the water fill starts the cycle.
 * Returns the tank's PlanView.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id, stageId } = await getValidatedRouterParams(event, valid(StageParams))
  const patch = await readValidatedBody(event, valid(StagePatchSchema))
  const tank = requireVisibleTank(actor, id)
  const stage = findStage(tank.id, stageId)
  if (!stage) throw createError({ statusCode: 404, statusMessage: 'Stage not found' })
  const now = new Date()
  const changes = applyStagePatch(actor, stage, patch, now)
  const trigger = tankTriggerAfterStage(tank, stage.key, changes.status)
  const db = useDB()
  const { after, tankAfter } = db.transaction((tx) => {
    const after = Object.keys(changes).length
      ? tx.update(planStages).set(changes).where(eq(planStages.id, stage.id)).returning().get()
      : stage
    const tankAfter = trigger
      ? moveTank({ tankId: tank.id, trigger, actor, cycleStartedAt: trigger === 'water-filled' ? tank.cycleStartedAt ?? now.toISOString() : undefined }, tx)
      : undefined
    return { after, tankAfter }
  })
  if (Object.keys(changes).length) writeAudit(actor, { action: 'plan-stage.update', entity: 'plan_stage', entityId: stage.id, before: stage, after })
  if (tankAfter) onTankDataChanged(tank.id, { actor, now })
  return planView(actor, tankAfter ?? tank)
})
