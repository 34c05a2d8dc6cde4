/** GET /api/notifications — the signed-in user's latest notices. Returns NotificationList { items, unread }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  return listNotifications(actor.id)
})
