import * as v from 'valibot'
import { STAFF_ROLES } from '../vocabulary'

/** PATCH /api/people/:id/role body: a staff role (client accounts belong to a client record and keep their role). */
export const PersonRoleSchema = v.object({
  role: v.picklist(STAFF_ROLES, 'Choose admin, aquarist or supervisor.'),
})
export type PersonRoleInput = v.InferOutput<typeof PersonRoleSchema>
