import { ClientCreateSchema } from '#shared/schemas/clients'
import { clients } from '#server/db/schema'

/** POST /api/clients — adds a client record (no sign-in account). Returns ClientView with status 201. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const input = await readValidatedBody(event, valid(ClientCreateSchema))
  const row = await writeTransaction((db) => {
    const created = db.insert(clients).values({
      organisationId: actor.organisationId,
      name: input.name,
      email: input.email || null,
      phone: input.phone || null,
      notes: input.notes || null,
    }).returning().get()
    writeAudit(actor, { action: 'client.create', entity: 'client', entityId: created.id, after: created })
    return created
  })
  setResponseStatus(event, 201)
  return clientView(actor, row.id)
})
