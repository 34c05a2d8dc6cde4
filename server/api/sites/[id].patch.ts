import { eq } from 'drizzle-orm'
import { SitePatchSchema } from '#shared/schemas/clients'
import { IdParams } from '#shared/schemas/common'
import { sites } from '#server/db/schema'

/** PATCH /api/sites/:id — edits a site's label, address and notes. Returns SiteView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireSite(actor, id)
  const input = await readValidatedBody(event, valid(SitePatchSchema))
  const before = requireSite(actor, id)
  const changes: Partial<typeof sites.$inferInsert> = {}
  if (input.label !== undefined) changes.label = input.label
  if (input.address !== undefined) changes.address = input.address || null
  if (input.roomNotes !== undefined) changes.roomNotes = input.roomNotes || null
  if (input.accessNotes !== undefined) changes.accessNotes = input.accessNotes || null
  if (!Object.keys(changes).length) return toSiteView(before)
  const after = await auditedChange(actor,
    db => db.update(sites).set(changes).where(eq(sites.id, id)).returning().get(),
    after => ({ action: 'site.update', entity: 'site', entityId: id, before, after }))
  return toSiteView(after)
})
