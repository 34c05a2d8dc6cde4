import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import type { SignOffSnapshot } from '#shared/types/sign-off'

/**
 * GET /api/tanks/:id/certificate.pdf — the sign-off certificate (one-page PDF) for the
 * tank's current sign-off; the client and staff who may see the tank may download it.
 * 404 when the tank is not visible or has no current sign-off.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = getTankView(actor, id)
  if (!tank) throw createError({ statusCode: 404, statusMessage: 'Tank not found' })
  const signOff = currentApprovedSignOff(id)
  if (!signOff?.decidedAt || !signOff.snapshot || !signOff.verificationCode) throw createError({ statusCode: 404, statusMessage: 'This tank has no current sign-off' })
  const { organisations, users } = tables
  const company = useDB().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, actor.organisationId)).get()?.name ?? ''
  const supervisorName = signOff.decidedBy ? useDB().select({ name: users.name }).from(users).where(eq(users.id, signOff.decidedBy)).get()?.name ?? '—' : '—'
  const origin = getRequestURL(event, { xForwardedHost: true, xForwardedProto: true }).origin
  const pdf = await renderCertificate({
    company,
    tankName: tank.name,
    clientName: tank.clientName,
    siteLabel: tank.siteLabel,
    volumeLitres: tank.volumeLitres + tank.sumpLitres,
    cycleMethod: tank.cycleMethod,
    cycleStartedAt: tank.cycleStartedAt,
    requestedAt: signOff.requestedAt,
    signedAt: signOff.decidedAt,
    supervisorName,
    aquaristName: tank.aquaristName,
    override: signOff.override,
    decisionNote: signOff.decisionNote,
    snapshot: signOff.snapshot as unknown as SignOffSnapshot,
    verificationCode: signOff.verificationCode,
    verifyUrl: `${origin}/verify/${signOff.verificationCode}`,
    units: actor.units,
  })
  const fileName = `tidewright-certificate-${tank.name.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '')}.pdf`
  setResponseHeaders(event, {
    'content-type': 'application/pdf',
    'content-disposition': `attachment; filename="${fileName}"`,
    'cache-control': 'private, no-store',
  })
  return Buffer.from(pdf)
})
