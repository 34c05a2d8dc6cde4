/** Roles live in the vocabulary; re-exported here so pages get `Role` auto-imported. */
export { STAFF_ROLES, type Role, type StaffRole } from '../vocabulary'
