import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import { TankPatchSchema } from '#shared/schemas/tanks'
import { tanks } from '../../db/schema'

/** PATCH /api/tanks/:id — edits a tank's profile; new dimensions recompute its volume. Returns TankView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const input = await readValidatedBody(event, valid(TankPatchSchema))
  const before = requireVisibleTank(actor, id)
  checkTankReferences(actor, { ...input, siteId: input.siteId ?? (input.clientId && input.clientId !== before.clientId ? null : undefined) }, before.clientId)
  const changes: Partial<typeof tanks.$inferInsert> = {}
  for (const key of ['name', 'clientId', 'siteId', 'sumpLitres', 'material', 'waterSource', 'cycleMethod', 'aquaristId', 'supervisorId'] as const) {
    if (input[key] !== undefined) (changes as Record<string, unknown>)[key] = input[key]
  }
  // A tank moved to another client cannot keep the old client's site.
  if (input.clientId && input.clientId !== before.clientId && input.siteId === undefined) changes.siteId = null
  if (input.shape && input.dimensions) {
    const computed = volumeFromDimensions(input.shape, input.dimensions)
    changes.shape = input.shape
    changes.dimensions = computed.dimensions
    changes.volumeLitres = computed.volumeLitres
  }
  if (!Object.keys(changes).length) return getTankView(actor, id)
  const after = useDB().update(tanks).set(changes).where(eq(tanks.id, id)).returning().get()
  writeAudit(actor, { action: 'tank.update', entity: 'tank', entityId: id, before, after })
  onTankDataChanged(id, { actor })
  return getTankView(actor, id)
})
