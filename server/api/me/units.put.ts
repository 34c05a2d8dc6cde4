import { eq } from 'drizzle-orm'
import { UnitsPreferenceSchema } from '#shared/schemas/account'
import { users } from '#server/db/schema'

/**
 * PUT /api/me/units — the signed-in person's unit system (US or metric), used on every
 * screen, calculator, e-mail and certificate they read. Audited with before and after.
 * Returns { units }.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { units } = await readValidatedBody(event, valid(UnitsPreferenceSchema))
  if (units !== actor.units) {
    await auditedChange(actor,
      db => db.update(users).set({ units }).where(eq(users.id, actor.id)).run(),
      () => ({ action: 'preferences.units', entity: 'user', entityId: actor.id, before: { units: actor.units }, after: { units } }))
  }
  return { units }
})
