import { eq } from 'drizzle-orm'
import { LoginSchema } from '#shared/schemas/auth'
import { users } from '#server/db/schema'
import { accountUsable, clientArchivedAt } from '#server/domain/people/people'

const WRONG = 'Wrong e-mail or password'
// Checked when the e-mail is unknown, so both failures take about as long.
let decoyHash: Promise<string> | undefined

/** POST /api/auth/login — signs in with e-mail and password. Returns { user: { id, name, role } }. */
export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, valid(LoginSchema))

  // Reserved before the (slow) password check: guesses sent together are counted first.
  const attempt = await reserveSignIn(event, email)
  if (attempt.refused) {
    setResponseHeader(event, 'Retry-After', attempt.retryAfterSeconds)
    throw createError({ statusCode: 429, statusMessage: 'Too many failed sign-ins. Try again later or reset your password.' })
  }
  if (attempt.delayMs) await new Promise(resolve => setTimeout(resolve, attempt.delayMs))

  const user = useDB().select().from(users).where(eq(users.email, email)).get()
  decoyHash ??= hashPassword('tidewright-decoy-password')
  const ok = user?.passwordHash && accountUsable(user, clientArchivedAt(useDB(), user))
    ? await verifyPassword(user.passwordHash, password)
    : (await verifyPassword(await decoyHash, password), false)
  if (!user || !ok) throw createError({ statusCode: 401, statusMessage: WRONG })

  await signInSucceeded(email, attempt)
  await signInAs(event, user)
  return { user: { id: user.id, name: user.name, role: user.role } }
})
