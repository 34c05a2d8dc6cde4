import { NOTICE_KINDS, wantsEmail } from '#shared/notifications/kinds'
import { emailChoices } from '#server/db/notices'

/** GET /api/me/notification-preferences — which notices reach the user by e-mail. Returns { items: [{ kind, label, description, email, locked }] }. */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const choices = emailChoices(useDB(), actor.id)
  return {
    items: NOTICE_KINDS.map(k => ({
      ...k,
      // Danger alerts on an aquarist's own tanks always reach them.
      locked: k.kind === 'alert-opened' && actor.role === 'aquarist',
      email: (k.kind === 'alert-opened' && actor.role === 'aquarist') || wantsEmail(choices, k.kind),
    })),
  }
})
