import { and, eq, isNull } from 'drizzle-orm'
import * as v from 'valibot'
import { notifications } from '#server/db/schema'

// Notice ids are UUIDs or stable keys such as `reminder:<tank>:<user>:<date>`.
const NoticeParams = v.object({ id: v.pipe(v.string(), v.regex(/^[\w:-]{1,200}$/, 'Not a valid id.')) })

/** POST /api/notifications/:id/read — marks one of the user's notices read. Returns { unread }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(NoticeParams))
  await writeTransaction((db) => {
    const mine = db.select({ id: notifications.id }).from(notifications).where(and(eq(notifications.id, id), eq(notifications.userId, actor.id))).get()
    if (!mine) throw createError({ statusCode: 404, statusMessage: 'Notice not found' })
    db.update(notifications).set({ readAt: new Date().toISOString() }).where(and(eq(notifications.id, id), isNull(notifications.readAt))).run()
  })
  announceNotices([actor.id])
  return { unread: unreadCount(actor.id) }
})
