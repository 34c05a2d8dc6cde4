import { asc, eq } from 'drizzle-orm'
import { STAFF_ROLES } from '#shared/vocabulary'
import { IdParams } from '#shared/schemas/common'
import { sites } from '#server/db/schema'

/** GET /api/clients/:id/sites — the client's sites, archived ones included. Returns SiteView[]. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  requireClient(actor, id)
  return useDB().select().from(sites).where(eq(sites.clientId, id)).orderBy(asc(sites.label), asc(sites.id)).all().map(toSiteView)
})
