/** POST /api/auth/logout — ends the session. Returns { ok: true }. */
export default defineEventHandler(async (event) => {
  await clearUserSession(event)
  return { ok: true }
})
