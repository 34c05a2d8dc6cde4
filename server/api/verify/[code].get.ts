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
    status: signOffs.status, decidedAt: signOffs.decidedAt, reopenedAt: signOffs.reopenedAt, snapshot: signOffs.snapshot,
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
    // As signed: a tank renamed since is still checked against the name on the certificate.
    tankName: row.snapshot?.facts?.tankName ?? row.tankName,
    company: row.snapshot?.facts?.company ?? row.company,
    signedAt: row.decidedAt,
    supervisorName: row.snapshot?.facts?.supervisorName ?? row.supervisorName,
    reopenedAt: row.reopenedAt,
  }
  return result
})
