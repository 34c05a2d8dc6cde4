import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import type { SignedTankFacts } from '#shared/types/sign-off'
import type { TankView } from '#shared/types/tanks'
import { amendmentsOf } from '#server/domain/sign-off/signed-record'
import type { Actor } from '#server/utils/access'

/** For a sign-off decided before its facts were kept with it: the tank as it is now (the only source there is). */
function legacyFacts(actor: Actor, tank: TankView, decidedBy: string | null): SignedTankFacts {
  const { organisations, users } = tables
  const company = useDB().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, actor.organisationId)).get()?.name ?? ''
  const supervisorName = decidedBy ? useDB().select({ name: users.name }).from(users).where(eq(users.id, decidedBy)).get()?.name ?? '—' : '—'
  return {
    company, tankName: tank.name, clientName: tank.clientName, siteLabel: tank.siteLabel, shape: tank.shape, dimensions: tank.dimensions,
    volumeLitres: tank.volumeLitres, sumpLitres: tank.sumpLitres, cycleMethod: tank.cycleMethod, cycleStartedAt: tank.cycleStartedAt,
    aquaristName: tank.aquaristName, supervisorName, stages: [],
  }
}

/**
 * GET /api/tanks/:id/certificate.pdf — the sign-off certificate (one-page PDF) for the
 * tank's current sign-off; the client and staff who may see the tank may download it.
 * Everything it prints comes from the decision's snapshot and the input it was made from (its
 * final tests, read in the heavy-work pool), plus any amendments since.
 * 404 when the tank is not visible or has no current sign-off.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = await getTankView(actor, id)
  if (!tank) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  const signOff = currentApprovedSignOff(id)
  if (!signOff?.decidedAt || !signOff.snapshot || !signOff.verificationCode) throw createError({ statusCode: 404, statusMessage: 'This tank has no current sign-off' })
  const snapshot = signOff.snapshot
  // Printed from the snapshot taken at the decision, never from the tank as it is now.
  const facts = snapshot.facts ?? legacyFacts(actor, tank, signOff.decidedBy)
  const pdf = await renderCertificateOffLoop({
    ...facts,
    volumeLitres: facts.volumeLitres + facts.sumpLitres,
    requestedAt: signOff.requestedAt,
    signedAt: signOff.decidedAt,
    override: signOff.override,
    decisionNote: signOff.decisionNote,
    snapshot,
    amendments: amendmentsOf(useDB(), signOff.id),
    verificationCode: signOff.verificationCode,
    verifyUrl: publicLink(`/verify/${signOff.verificationCode}`),
    units: actor.units,
  }, signOff.id)
  const fileName = `tidewright-certificate-${facts.tankName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')}.pdf`
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${fileName}"`,
    'cache-control': 'private, no-store',
  })
  return Buffer.from(pdf)
})
