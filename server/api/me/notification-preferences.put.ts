import { NotificationPreferencesSchema } from '#shared/schemas/notifications'
import { emailChoices } from '#server/db/notices'
import { notificationPreferences } from '#server/db/schema'

/** PUT /api/me/notification-preferences — sets e-mail on or off per notice kind (danger alerts to the assigned aquarist stay on regardless). Returns { emailKinds }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { emailKinds } = await readValidatedBody(event, valid(NotificationPreferencesSchema))
  const db = useDB()
  const before = emailChoices(db, actor.id)
  const next = { ...before, ...emailKinds }
  await auditedChange(actor,
    tx => tx.insert(notificationPreferences).values({ userId: actor.id, emailKinds: next })
      .onConflictDoUpdate({ target: notificationPreferences.userId, set: { emailKinds: next, updatedAt: new Date().toISOString() } }).run(),
    () => ({ action: 'preferences.update', entity: 'notification_preferences', entityId: actor.id, before, after: next }))
  return { emailKinds: next }
})
