import { TankCreateSchema } from '#shared/schemas/tanks'
import { planStages, tanks } from '#server/db/schema'

/** POST /api/tanks — adds a tank with its own copy of the company's plan template; the server computes its volume. Returns TankView with status 201. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const input = await readValidatedBody(event, valid(TankCreateSchema))
  checkTankReferences(actor, input)
  const { dimensions, volumeLitres } = volumeFromDimensions(input.shape, input.dimensions)
  const tank = await writeTransaction((tx) => {
    const row = tx.insert(tanks).values({
      organisationId: actor.organisationId,
      clientId: input.clientId,
      siteId: input.siteId ?? null,
      name: input.name,
      shape: input.shape,
      dimensions,
      volumeLitres,
      sumpLitres: input.sumpLitres,
      material: input.material,
      waterSource: input.waterSource,
      cycleMethod: input.cycleMethod,
      aquaristId: input.aquaristId ?? (actor.role === 'aquarist' ? actor.id : null),
      supervisorId: input.supervisorId ?? null,
    }).returning().get()
    tx.insert(planStages).values(planRowsForNewTank(actor.organisationId, row.id)).run()
    writeAudit(actor, { action: 'tank.create', entity: 'tank', entityId: row.id, after: row })
    return row
  })
  await onTankDataChanged(tank.id, { actor })
  setResponseStatus(event, 201)
  return await getTankView(actor, tank.id)
})
