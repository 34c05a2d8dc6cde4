import { AttentionQuerySchema } from '#shared/schemas/attention'

/**
 * GET /api/attention — every tank the user may see with what it needs today (open alerts
 * and who acknowledged them, overdue tests, stalls, sign-offs, stocking due), most urgent
 * first, each cycling tank with its completion forecast; `?aquarist=<id>|unassigned` and
 * `?sort=urgency|name|last-test|completion` (tanks with a danger alert stay first in any order).
 * Returns AttentionBoard.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const query = await getValidatedQuery(event, valid(AttentionQuerySchema))
  return attentionBoard(actor, query, requestNow(event))
})
