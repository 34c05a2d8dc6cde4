import { eq } from 'drizzle-orm'
import { StageParams, StagePatchSchema } from '#shared/schemas/plan'
import { planStages } from '#server/db/schema'
import { recordAudit } from '#server/domain/audit/record'

/**
 * PATCH /api/tanks/:id/stages/:stageId — changes a stage's status, ticks, notes or helper values.
 * Starting a stage moves a planned tank to building; finishing the water fill starts the cycle.
 * Commissioning gates refuse (400, per field) a leak test passed in under 24 h and a survey over
 * the design floor load closed without a recorded structural check.
 * A stage finished in a signed-off record changes only after reopening (409). Returns the tank's PlanView.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id, stageId } = await getValidatedRouterParams(event, valid(StageParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  if (!findStage(requireVisibleTank(actor, id).id, stageId)) throw createError({ statusCode: 404, statusMessage: 'Stage not found' })
  const patch = await readValidatedBody(event, valid(StagePatchSchema))
  const now = new Date()
  // The stage, the tank status it causes and their audit rows commit together, checked under the
  // write lock (a sign-off or another change that went first while this one waited counts).
  const { tank, tankAfter } = await writeTransaction((tx) => {
    const tank = requireVisibleTank(actor, id)
    const stage = findStage(tank.id, stageId)
    if (!stage) throw createError({ statusCode: 404, statusMessage: 'Stage not found' })
    assertStageUnsigned(tank.id, stage.key)
    const changes = applyStagePatch(actor, tank, stage, patch, now)
    const trigger = tankTriggerAfterStage(tank, stage.key, changes.status)
    if (Object.keys(changes).length) {
      const after = tx.update(planStages).set(changes).where(eq(planStages.id, stage.id)).returning().get()
      recordAudit(tx, actor, { action: 'plan-stage.update', entity: 'plan_stage', entityId: stage.id, before: stage, after })
    }
    const tankAfter = trigger
      ? moveTank({ tankId: tank.id, trigger, actor, cycleStartedAt: trigger === 'water-filled' ? tank.cycleStartedAt ?? now.toISOString() : undefined }, tx)
      : undefined
    return { tank, tankAfter }
  })
  if (tankAfter) await onTankDataChanged(tank.id, { actor, now })
  return planView(actor, tankAfter ?? tank)
})
