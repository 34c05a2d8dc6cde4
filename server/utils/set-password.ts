import type { H3Event } from 'h3'
import { eq } from 'drizzle-orm'
import { passwordProblem, SetPasswordSchema } from '#shared/schemas/account'
import { organisations, users } from '#server/db/schema'
import { passwordWeakness } from '#server/domain/accounts/password-strength'
import type { TokenPurpose } from './auth-tokens'
import { endSessionsOfUser } from '#server/domain/sessions/sessions'
import { recordAudit } from '#server/domain/audit/record'

const GONE = 'This link has expired or has already been used'

/** Shared by accept-invite and reset-password: checks the token and password rules, uses the token once, sets the password, ends every older session and signs in. */
export async function setPasswordWithToken(event: H3Event, purpose: TokenPurpose) {
  const { token, password } = await readValidatedBody(event, valid(SetPasswordSchema))
  const now = requestNow(event)
  const found = peekToken(token, purpose, now)
  if (!found) throw createError({ statusCode: 410, statusMessage: GONE })
  const company = useDB().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, found.user.organisationId)).get()?.name
  const problem = passwordProblem(password, found.user.email) ?? await passwordWeakness(password, { email: found.user.email, name: found.user.name, company })
  if (problem) fieldError([{ field: 'password', message: problem }])
  const passwordHash = await hashPassword(password)
  const db = useDB()
  const userId = await writeTransaction((t) => {
    const id = consumeToken(t, token, purpose, now)
    if (id) {
      t.update(users).set({ passwordHash }).where(eq(users.id, id)).run()
      // Whoever knew the old password (or holds a cookie from then) is out.
      endSessionsOfUser(t, id, { reason: 'password-reset', now })
      const { organisationId } = t.select({ organisationId: users.organisationId }).from(users).where(eq(users.id, id)).get()!
      recordAudit(t, { id, organisationId }, { action: purpose === 'invite' ? 'user.invite-accepted' : 'user.password-reset', entity: 'user', entityId: id })
    }
    return id
  })
  if (!userId) throw createError({ statusCode: 410, statusMessage: GONE })
  const user = db.select().from(users).where(eq(users.id, userId)).get()!
  await clearSignInFailures(user.email)
  await signInAs(event, user)
  return { user: { id: user.id, name: user.name, role: user.role } }
}
