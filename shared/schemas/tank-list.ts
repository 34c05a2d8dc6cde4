import * as v from 'valibot'
import { TANK_STATUSES } from '../vocabulary'

export const TANK_SORT_FIELDS = ['name', 'status', 'client', 'updated', 'stage'] as const

/** Query string of GET /api/tanks. */
export const TankListQuerySchema = v.object({
  q: v.optional(v.pipe(v.string(), v.trim(), v.maxLength(100, 'Search text is too long.'))),
  status: v.optional(v.picklist(TANK_STATUSES, 'Unknown status.')),
  clientId: v.optional(v.pipe(v.string(), v.uuid('Not a valid client id.'))),
  /** A plan stage key: tanks whose current stage it is; `complete` for tanks with every stage finished. */
  stage: v.optional(v.pipe(v.string(), v.regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'Unknown stage.'), v.maxLength(40, 'Unknown stage.'))),
  sort: v.optional(v.picklist(TANK_SORT_FIELDS, 'Unknown sort field.'), 'updated'),
  dir: v.optional(v.picklist(['asc', 'desc'], 'Sort direction is asc or desc.'), 'desc'),
  page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(100000, 'Page is too large.')), '1'),
  pageSize: v.optional(v.pipe(v.string(), v.toNumber('Page size must be a number.'), v.integer('Page size must be a whole number.'), v.minValue(1, 'Page size is at least 1.'), v.maxValue(100, 'Page size is at most 100.')), '25'),
})
export type TankListQuery = v.InferOutput<typeof TankListQuerySchema>
