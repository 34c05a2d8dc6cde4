import { eq } from 'drizzle-orm'
import { ForgotPasswordSchema } from '#shared/schemas/account'
import { recordAudit } from '#server/domain/audit/record'
import { users } from '#server/db/schema'

const ANSWER = 'If that address has a Tidewright account, we have sent it a link to choose a new password.'

/** POST /api/auth/forgot-password — e-mails a single-use reset link. At most a few per address and network an hour. The answer is the same whether or not the address has an account, and whether or not a mail was sent. Returns { message }. */
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, valid(ForgotPasswordSchema))
  // Counted before the address is looked up: a refused request answers like any other.
  if (!await mayMailReset(event, email)) return { message: ANSWER }
  const now = requestNow(event)
  const db = useDB()
  const user = db.select().from(users).where(eq(users.email, email)).get()
  if (user?.active) {
    await writeTransaction((t) => {
      queuePasswordReset(t, user, now)
      recordAudit(t, { id: user.id, organisationId: user.organisationId }, { action: 'user.reset-requested', entity: 'user', entityId: user.id })
    })
    kickMailWorker()
  }
  return { message: ANSWER }
})
