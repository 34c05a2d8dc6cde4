import type { ListOf } from '#shared/types/list'
import type { ReviewItem } from '#shared/types/sign-off'

/**
 * GET /api/reviews — the sign-off requests waiting for the signed-in supervisor (an
 * admin sees the whole company's), oldest first, with each tank's phase, days cycling
 * and unresolved alerts. Returns ListOf<ReviewItem>.
 */
export default defineEventHandler(async (event): Promise<ListOf<ReviewItem>> => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  return { items: reviewQueue(actor, requestNow(event)) }
})
