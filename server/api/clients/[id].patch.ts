import { eq } from 'drizzle-orm'
import { ClientPatchSchema } from '#shared/schemas/clients'
import { IdParams } from '#shared/schemas/common'
import { clients } from '#server/db/schema'

/** PATCH /api/clients/:id — edits a client's name and contact details. Returns ClientView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireClient(actor, id)
  const input = await readValidatedBody(event, valid(ClientPatchSchema))
  const before = requireClient(actor, id)
  const changes: Partial<typeof clients.$inferInsert> = {}
  if (input.name !== undefined) changes.name = input.name
  if (input.email !== undefined) changes.email = input.email || null
  if (input.phone !== undefined) changes.phone = input.phone || null
  if (input.notes !== undefined) changes.notes = input.notes || null
  if (Object.keys(changes).length) {
    await auditedChange(actor,
      db => db.update(clients).set(changes).where(eq(clients.id, id)).returning().get(),
      after => ({ action: 'client.update', entity: 'client', entityId: id, before, after }))
  }
  return clientView(actor, id)
})
