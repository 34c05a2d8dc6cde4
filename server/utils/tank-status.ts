import type { Db } from '#server/db/connection'
import { changeTankStatus, TankStatusRefused, type StatusChange } from '#server/domain/tanks/status'

/** A lifecycle refusal as the HTTP answer: the role may not (403), no such tank (404), not from this status (409). */
export function tankStatusHttpError(error: TankStatusRefused) {
  const statusCode = error.refusal === 'role' ? 403 : error.refusal === 'missing' ? 404 : 409
  return createError({ statusCode, statusMessage: error.message })
}

/**
 * `changeTankStatus` for a route: a change the lifecycle refuses is a 403 (the role may
 * not) or a 409 (the tank is not in a status it applies to). Pass the route's transaction
 * when the status changes together with other rows.
 */
export function moveTank(change: StatusChange, db: Db = useDB()) {
  try {
    return changeTankStatus(db, change)
  }
  catch (error) {
    if (error instanceof TankStatusRefused) throw tankStatusHttpError(error)
    throw error
  }
}
