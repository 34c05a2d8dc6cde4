import { StageParams } from '#shared/schemas/plan'

/** POST /api/tanks/:id/stages/:stageId/uploads — attaches a photo (JPEG, PNG, WebP) or PDF to a stage, multipart field `file`. Returns UploadView with status 201; 413 too large, 415 wrong type, 409 for a stage finished in a signed-off record. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id, stageId } = await getValidatedRouterParams(event, valid(StageParams))
  const tank = requireVisibleTank(actor, id)
  const stage = findStage(tank.id, stageId)
  if (!stage) throw createError({ statusCode: 404, statusMessage: 'Stage not found' })
  assertStageUnsigned(tank.id, stage.key)
  const file = await receiveUpload(event)
  const row = await storeUpload(actor, { tankId: tank.id, stageId: stage.id }, file)
  setResponseStatus(event, 201)
  return toUploadView(row, new Map([[actor.id, actor.name]]))
})
