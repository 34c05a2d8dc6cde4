import * as v from 'valibot'

/** PATCH /api/people/:id/role body: a staff role (client accounts belong to a client record and keep their role). */
export const PersonRoleSchema = v.object({
  role: v.picklist(['admin', 'aquarist', 'supervisor'], 'Choose admin, aquarist or supervisor.'),
})
export type PersonRoleInput = v.InferOutput<typeof PersonRoleSchema>
