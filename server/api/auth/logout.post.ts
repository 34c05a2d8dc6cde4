/** POST /api/auth/logout — ends the session on the server (its row, through the clear hook) and clears the cookie. Returns { ok: true }. */
export default defineEventHandler(async (event) => {
  await clearUserSession(event)
  return { ok: true }
})
