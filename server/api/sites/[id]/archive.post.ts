import { eq } from 'drizzle-orm'
import { ArchiveSchema, IdParams } from '#shared/schemas/common'
import { sites } from '#server/db/schema'

/** POST /api/sites/:id/archive — archives a site (or restores it with `{ archived: false }`). Returns SiteView. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireSite(actor, id)
  const { archived } = await readValidatedBody(event, valid(ArchiveSchema))
  const before = requireSite(actor, id)
  if (!!before.archivedAt === archived) return toSiteView(before)
  const after = await auditedChange(actor,
    db => db.update(sites).set({ archivedAt: archived ? new Date().toISOString() : null }).where(eq(sites.id, id)).returning().get(),
    after => ({ action: archived ? 'site.archive' : 'site.restore', entity: 'site', entityId: id, before, after }))
  return toSiteView(after)
})
