import * as v from 'valibot'

export const ATTENTION_SORTS = ['urgency', 'name', 'last-test'] as const

/** Query string of GET /api/attention; the board keeps the same keys in its page URL. */
export const AttentionQuerySchema = v.object({
  /** An aquarist's user id, or `unassigned` for tanks without one. */
  aquarist: v.optional(v.union([v.literal('unassigned'), v.pipe(v.string(), v.uuid('Not a valid aquarist id.'))], 'Not a valid aquarist id.')),
  sort: v.optional(v.picklist(ATTENTION_SORTS, 'Sort by urgency, name or last-test.'), 'urgency'),
})
export type AttentionQuery = v.InferOutput<typeof AttentionQuerySchema>
