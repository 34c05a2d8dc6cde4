import { SiteCreateSchema } from '#shared/schemas/clients'
import { IdParams } from '#shared/schemas/common'
import { sites } from '#server/db/schema'

/** POST /api/clients/:id/sites — adds a site (address, room and access notes) to a client. Returns SiteView with status 201. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  requireClient(actor, id)
  const input = await readValidatedBody(event, valid(SiteCreateSchema))
  const row = await auditedChange(actor, db => db.insert(sites).values({
    organisationId: actor.organisationId,
    clientId: id,
    label: input.label,
    address: input.address || null,
    roomNotes: input.roomNotes || null,
    accessNotes: input.accessNotes || null,
  }).returning().get(), row => ({ action: 'site.create', entity: 'site', entityId: row.id, after: row }))
  setResponseStatus(event, 201)
  return toSiteView(row)
})
