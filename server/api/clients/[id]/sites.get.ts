import { STAFF_ROLES } from '#shared/vocabulary'
import { IdParams } from '#shared/schemas/common'
import type { ListOf } from '#shared/types/list'
import type { SiteView } from '#shared/types/clients'
import { clientSites } from '#server/domain/clients/queries'

/** GET /api/clients/:id/sites — the client's sites, archived ones included. Returns ListOf<SiteView>. */
export default defineEventHandler(async (event): Promise<ListOf<SiteView>> => {
  const actor = await requireActor(event, STAFF_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  requireClient(actor, id)
  return { items: clientSites(useDB(), id) }
})
