import { eq } from 'drizzle-orm'
import { LoginSchema } from '#shared/schemas/auth'
import { users } from '../../db/schema'

const WRONG = 'Wrong e-mail or password'
// Checked when the e-mail is unknown, so both failures take about as long.
let decoyHash: Promise<string> | undefined

/** POST /api/auth/login — signs in with e-mail and password. Returns { user: { id, name, role } }. */
export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, valid(LoginSchema))
  const address = getRequestIP(event) ?? 'unknown'

  const throttle = signInThrottle(email, address)
  if (throttle.refused) {
    setResponseHeader(event, 'Retry-After', throttle.retryAfterSeconds)
    throw createError({ statusCode: 429, statusMessage: 'Too many failed sign-ins. Try again later or reset your password.' })
  }
  if (throttle.delayMs) await new Promise(resolve => setTimeout(resolve, throttle.delayMs))

  const user = useDB().select().from(users).where(eq(users.email, email)).get()
  decoyHash ??= hashPassword('tidewright-decoy-password')
  const ok = user?.passwordHash && user.active
    ? await verifyPassword(user.passwordHash, password)
    : (await verifyPassword(await decoyHash, password), false)
  if (!user || !ok) {
    recordSignInFailure(email, address)
    throw createError({ statusCode: 401, statusMessage: WRONG })
  }

  clearSignInFailures(email)
  await signInAs(event, user)
  return { user: { id: user.id, name: user.name, role: user.role } }
})
