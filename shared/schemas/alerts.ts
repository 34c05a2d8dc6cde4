import * as v from 'valibot'
import { ALERT_STATUSES } from '../vocabulary'

/** An alert status, or `active` for every status still asking for attention. */
export const ALERT_STATUS_FILTERS = [...ALERT_STATUSES, 'active'] as const
export type AlertStatusFilter = (typeof ALERT_STATUS_FILTERS)[number]

/** GET /api/alerts query: `active` means open or acknowledged. */
export const AlertListQuery = v.object({
  status: v.optional(v.picklist(ALERT_STATUS_FILTERS, 'Choose open, acknowledged, resolved or active.')),
  tankId: v.optional(v.pipe(v.string(), v.uuid('Not a valid tank id.'))),
  sort: v.optional(v.picklist(['newest', 'oldest'], 'Sort by newest or oldest.'), 'newest'),
})
export type AlertListQueryInput = v.InferOutput<typeof AlertListQuery>

/** POST /api/alerts/:id/acknowledge body. */
export const AlertAcknowledgeSchema = v.object({
  note: v.optional(v.pipe(v.string('The note must be text.'), v.trim(), v.maxLength(1000, 'Keep the note under 1000 characters.'))),
})

/** POST /api/alerts/:id/resolve body: resolving by hand needs a reason. */
export const AlertResolveSchema = v.object({
  note: v.pipe(v.string('Say why the alert is resolved.'), v.trim(), v.minLength(3, 'Say why the alert is resolved.'), v.maxLength(1000, 'Keep the note under 1000 characters.')),
})
