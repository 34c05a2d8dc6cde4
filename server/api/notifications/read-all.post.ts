import { and, eq, isNull } from 'drizzle-orm'
import { notifications } from '#server/db/schema'

/** POST /api/notifications/read-all — marks all of the user's notices read. Returns { unread: 0 }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  await writeTransaction(db => db.update(notifications).set({ readAt: new Date().toISOString() }).where(and(eq(notifications.userId, actor.id), isNull(notifications.readAt))).run())
  announceNotices([actor.id])
  return { unread: unreadCount(actor.id) }
})
