import { and, eq, inArray } from 'drizzle-orm'
import { VerifyParams } from '#shared/schemas/sign-off'
import type { VerifyResult } from '#shared/types/sign-off'

/**
 * GET /api/verify/:code — public: checks a certificate's verification code against the
 * record. Returns only minimal facts (VerifyResult: tank, company, signed date,
 * supervisor, valid or reopened); 404 for a code that matches no sign-off.
 */
export default defineEventHandler(async (event) => {
  const { code } = await getValidatedRouterParams(event, valid(VerifyParams))
  const { signOffs, tanks, organisations, users } = tables
  const row = useDB().select({
    status: signOffs.status, decidedAt: signOffs.decidedAt, reopenedAt: signOffs.reopenedAt,
    tankName: tanks.name, company: organisations.name, supervisorName: users.name,
  }).from(signOffs)
    .innerJoin(tanks, eq(tanks.id, signOffs.tankId))
    .innerJoin(organisations, eq(organisations.id, signOffs.organisationId))
    .leftJoin(users, eq(users.id, signOffs.decidedBy))
    .where(and(eq(signOffs.verificationCode, code), inArray(signOffs.status, ['approved', 'reopened']))).get()
  if (!row || !row.decidedAt) throw createError({ statusCode: 404, statusMessage: 'No sign-off carries this code' })
  const result: VerifyResult = {
    valid: row.status === 'approved',
    status: row.status === 'approved' ? 'approved' : 'reopened',
    tankName: row.tankName,
    company: row.company,
    signedAt: row.decidedAt,
    supervisorName: row.supervisorName,
    reopenedAt: row.reopenedAt,
  }
  return result
})
