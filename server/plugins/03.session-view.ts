/**
 * What the browser learns about its session (GET /api/_auth/session, also during SSR) comes
 * from the database, not from the cookie: the person as they are now, or nobody when the
 * session has ended. Clearing the session (sign-out, DELETE /api/_auth/session) ends its row.
 */
import { endSessionByToken } from '#server/domain/sessions/sessions'
import { readOrganisationSettings } from '#server/db/settings'

export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    const signedIn = await resolveSignedIn(event)
    delete session.secure
    if (!signedIn) {
      delete session.user
      if (hasSessionCookie(event)) await clearUserSession(event)
      return
    }
    const { user } = signedIn
    const { timeZone } = readOrganisationSettings(useDB(), user.organisationId)
    session.user = { id: user.id, name: user.name, role: user.role, organisationId: user.organisationId, units: user.units, timeZone }
  })
  sessionHooks.hook('clear', async (session, event) => {
    const token = session.secure?.sessionToken
    forgetSessionCookie(event, token)
    if (token) await writeTransaction(db => endSessionByToken(db, token, 'signed-out', requestNow(event)))
  })
})
