/** The signed-in user's notification centre. */
import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import type { NotificationList } from '#shared/types/alerts'
import { notifications } from '#server/db/schema'

/** How many of the user's notices are unread. */
export function unreadCount(userId: string): number {
  return useDB().select({ n: sql<number>`count(*)` }).from(notifications)
    .where(and(eq(notifications.userId, userId), isNull(notifications.readAt))).get()?.n ?? 0
}

/** The user's latest notices and the unread count. */
export function listNotifications(userId: string, limit = 50): NotificationList {
  const items = useDB().select().from(notifications).where(eq(notifications.userId, userId))
    .orderBy(desc(notifications.createdAt), desc(notifications.id)).limit(limit).all()
    .map(n => ({ id: n.id, kind: n.kind, title: n.title, body: n.body, link: n.link, alertId: n.alertId, createdAt: n.createdAt, readAt: n.readAt }))
  return { items, unread: unreadCount(userId) }
}
