import { endSessionsOfUser } from '#server/domain/sessions/sessions'

/** POST /api/me/sessions/end-others — ends every session of the signed-in person except this one. Returns { ended: number }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const ended = await writeTransaction(db => endSessionsOfUser(db, actor.id, { except: actor.sessionId, reason: 'ended-by-person', now: requestNow(event) }))
  return { ended }
})
