import { eq } from 'drizzle-orm'
import { ArchiveSchema, IdParams } from '#shared/schemas/common'
import { clients } from '#server/db/schema'

/** POST /api/clients/:id/archive — archives a client (or restores it with `{ archived: false }`). Returns ClientView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireClient(actor, id)
  const { archived } = await readValidatedBody(event, valid(ArchiveSchema))
  const before = requireClient(actor, id)
  if (!!before.archivedAt !== archived) {
    await auditedChange(actor,
      db => db.update(clients).set({ archivedAt: archived ? new Date().toISOString() : null }).where(eq(clients.id, id)).returning().get(),
      after => ({ action: archived ? 'client.archive' : 'client.restore', entity: 'client', entityId: id, before, after }))
  }
  return clientView(actor, id)
})
