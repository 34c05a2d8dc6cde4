import { desc } from 'drizzle-orm'
import { mailOutbox } from '#server/db/schema'

/** GET /api/dev/outbox — tests only (NUXT_TEST_HOOKS=1, otherwise 404): delivery state of the outbox, without bodies. Returns { items }. */
export default defineEventHandler(() => {
  requireSwitch(useRuntimeConfig().testHooks)
  const items = useDB().select({
    messageId: mailOutbox.messageId, toAddress: mailOutbox.toAddress, kind: mailOutbox.kind, status: mailOutbox.status,
    attempts: mailOutbox.attempts, lastError: mailOutbox.lastError,
  }).from(mailOutbox).orderBy(desc(mailOutbox.createdAt)).all()
  return { items }
})
