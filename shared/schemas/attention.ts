import * as v from 'valibot'

/** Orders of the board; whatever the order, tanks with a danger alert stay at the top (`sortBoard`). */
export const ATTENTION_SORTS = ['urgency', 'name', 'last-test', 'completion'] as const
export type AttentionSort = (typeof ATTENTION_SORTS)[number]

/** Query string of GET /api/attention; the board keeps the same keys in its page URL. */
export const AttentionQuerySchema = v.object({
  /** An aquarist's user id, or `unassigned` for tanks without one. */
  aquarist: v.optional(v.union([v.literal('unassigned'), v.pipe(v.string(), v.uuid('Not a valid aquarist id.'))], 'Not a valid aquarist id.')),
  sort: v.optional(v.picklist(ATTENTION_SORTS, 'Sort by urgency, name, last-test or completion.'), 'urgency'),
})
export type AttentionQuery = v.InferOutput<typeof AttentionQuerySchema>
