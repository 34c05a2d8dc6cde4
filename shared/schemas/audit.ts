/** Query of the audit trail viewer and its CSV export. */
import * as v from 'valibot'
import { isoDayText } from './common'

const day = (what: string) => v.optional(isoDayText(what))

/** GET /api/audit query: filters by tank, person, action (a code like `reading.update` or its group `reading`) and days. */
export const AuditQuerySchema = v.pipe(
  v.object({
    tankId: v.optional(v.pipe(v.string(), v.uuid('Not a valid tank id.'))),
    actorId: v.optional(v.pipe(v.string(), v.uuid('Not a valid person id.'))),
    action: v.optional(v.pipe(v.string(), v.maxLength(60, 'Unknown action.'), v.regex(/^[a-z-]+(\.[a-z-]+)?$/, 'Unknown action.'))),
    from: day('From'),
    to: day('To'),
    page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(100000, 'Page is too large.')), '1'),
    pageSize: v.optional(v.pipe(v.string(), v.toNumber('Page size must be a number.'), v.integer('Page size must be a whole number.'), v.minValue(1, 'Page size is at least 1.'), v.maxValue(100, 'Page size is at most 100.')), '50'),
  }),
  v.forward(v.check(q => !q.from || !q.to || q.from <= q.to, 'To must not be before From.'), ['to']),
)
export type AuditQuery = v.InferOutput<typeof AuditQuerySchema>
