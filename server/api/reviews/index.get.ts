/**
 * GET /api/reviews — the sign-off requests waiting for the signed-in supervisor (an
 * admin sees the whole company's), oldest first, with each tank's phase, days cycling
 * and unresolved alerts. Returns ReviewItem[].
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'supervisor'])
  return reviewQueue(actor)
})
