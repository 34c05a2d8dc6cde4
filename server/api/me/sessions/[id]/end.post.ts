import { and, eq } from 'drizzle-orm'
import { SessionIdParams } from '#shared/schemas/sessions'
import { sessions } from '#server/db/schema'
import { endSession } from '#server/domain/sessions/sessions'

/** POST /api/me/sessions/:id/end — ends one of the signed-in person's own sessions (another device, or this one). Returns { ok: true }; 404 if not theirs or already ended. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(SessionIdParams))
  const ended = await writeTransaction((db) => {
    const own = db.select({ id: sessions.id }).from(sessions).where(and(eq(sessions.id, id), eq(sessions.userId, actor.id))).get()
    return Boolean(own) && endSession(db, id, 'ended-by-person', requestNow(event))
  })
  if (!ended) throw createError({ statusCode: 404, statusMessage: 'Session not found' })
  if (id === actor.sessionId) await clearUserSession(event)
  return { ok: true }
})
