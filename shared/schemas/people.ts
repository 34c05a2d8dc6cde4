/** Inputs of the people admin: the list's query and a role change. */
import * as v from 'valibot'
import { PERSON_STATUSES } from '../types/people'
import { ROLES, STAFF_ROLES } from '../vocabulary'

/** Query string of GET /api/people. */
export const PeopleQuerySchema = v.object({
  q: v.optional(v.pipe(v.string(), v.trim(), v.maxLength(100, 'Search text is too long.'))),
  role: v.optional(v.picklist(ROLES, 'Unknown role.')),
  status: v.optional(v.picklist(PERSON_STATUSES, 'Unknown status.')),
  page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(100000, 'Page is too large.')), '1'),
  pageSize: v.optional(v.pipe(v.string(), v.toNumber('Page size must be a number.'), v.integer('Page size must be a whole number.'), v.minValue(1, 'Page size is at least 1.'), v.maxValue(100, 'Page size is at most 100.')), '25'),
})
export type PeopleQuery = v.InferOutput<typeof PeopleQuerySchema>

/** PATCH /api/people/:id/role body: a staff role (client accounts belong to a client record and keep their role). */
export const PersonRoleSchema = v.object({
  role: v.picklist(STAFF_ROLES, 'Choose admin, aquarist or supervisor.'),
})
export type PersonRoleInput = v.InferOutput<typeof PersonRoleSchema>
