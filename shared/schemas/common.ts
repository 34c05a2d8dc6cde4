import * as v from 'valibot'

/** Route parameter `:id` — our ids are UUIDs. */
export const IdParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
})
