import { TokenQuery } from '#shared/schemas/account'

/** GET /api/auth/token?token= — whether an e-mailed link is still good, for the set-password pages. Returns { purpose, email, name }; 404 when used, expired or unknown. */
export default defineEventHandler(async (event) => {
  const { token } = await getValidatedQuery(event, valid(TokenQuery))
  const found = peekToken(token, undefined, requestNow(event))
  if (!found) throw createError({ statusCode: 404, statusMessage: 'This link has expired or has already been used' })
  return { purpose: found.purpose, email: found.user.email, name: found.user.name }
})
