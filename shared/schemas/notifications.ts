import * as v from 'valibot'
import { NOTICE_KINDS, type NoticeKind } from '../notifications/kinds'

const KIND_KEYS = NOTICE_KINDS.map(k => k.kind) as [NoticeKind, ...NoticeKind[]]

/** PUT /api/me/notification-preferences body: e-mail on or off per notice kind. */
export const NotificationPreferencesSchema = v.object({
  emailKinds: v.record(v.picklist(KIND_KEYS, 'Unknown notice kind.'), v.boolean('Choose on or off.')),
})
export type NotificationPreferencesInput = v.InferOutput<typeof NotificationPreferencesSchema>
