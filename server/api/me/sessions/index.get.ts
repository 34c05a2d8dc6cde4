import type { SessionView } from '#shared/types/sessions'
import { liveSessionsOfUser } from '#server/domain/sessions/sessions'

/** GET /api/me/sessions — the signed-in person's live sessions, the current one marked. Returns { items: SessionView[] }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const rows = liveSessionsOfUser(useDB(), actor.id, requestNow(event), sessionLifetimes())
  const items: SessionView[] = rows.map(row => ({
    id: row.id,
    current: row.id === actor.sessionId,
    createdAt: row.createdAt,
    lastSeenAt: row.lastSeenAt,
    expiresAt: row.expiresAt,
    userAgent: row.userAgent,
    address: row.address,
  }))
  return { items }
})
