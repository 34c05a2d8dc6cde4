import { ClientListQuerySchema } from '#shared/schemas/clients'
import { STAFF_ROLES } from '#shared/vocabulary'

/** GET /api/clients — the company's clients, searched, sorted and paginated on the server. Returns ClientList. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const query = await getValidatedQuery(event, valid(ClientListQuerySchema))
  return listClients(actor, query)
})
