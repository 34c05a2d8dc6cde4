import { eq } from 'drizzle-orm'
import * as v from 'valibot'
import { IdParams } from '#shared/schemas/common'
import { clients } from '../../../db/schema'

const ArchiveSchema = v.object({ archived: v.optional(v.boolean('archived is true or false.'), true) })

/** POST /api/clients/:id/archive — archives a client (or restores it with `{ archived: false }`). Returns ClientView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const { archived } = await readValidatedBody(event, valid(ArchiveSchema))
  const before = requireClient(actor, id)
  if (!!before.archivedAt !== archived) {
    const after = useDB().update(clients).set({ archivedAt: archived ? new Date().toISOString() : null }).where(eq(clients.id, id)).returning().get()
    writeAudit(actor, { action: archived ? 'client.archive' : 'client.restore', entity: 'client', entityId: id, before, after })
  }
  return clientView(actor, id)
})
