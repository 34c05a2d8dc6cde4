import { eq } from 'drizzle-orm'
import { IdParams } from '#shared/schemas/common'
import { TankPatchSchema } from '#shared/schemas/tanks'
import { tanks } from '#server/db/schema'
import { recordAmendment, signedFieldChanges, signedFieldsInWords } from '#server/domain/sign-off/signed-record'

/**
 * PATCH /api/tanks/:id — edits a tank's profile; new dimensions recompute its volume. On a
 * signed-off tank, fields the certificate prints need `amendmentReason` (409 without); the
 * change, its amendment and audit rows commit together. Returns TankView.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ['admin', 'aquarist'])
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  // Params before body: 404 for a row the actor may not see, whatever the body. Read again after the await.
  requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(TankPatchSchema))
  const before = requireVisibleTank(actor, id)
  checkTankReferences(actor, { ...input, siteId: input.siteId ?? (input.clientId && input.clientId !== before.clientId ? null : undefined) }, before.clientId)
  const changes: Partial<typeof tanks.$inferInsert> = {}
  for (const key of ['name', 'clientId', 'siteId', 'sumpLitres', 'material', 'waterSource', 'cycleMethod', 'aquaristId', 'supervisorId'] as const) {
    if (input[key] !== undefined) (changes as Record<string, unknown>)[key] = input[key]
  }
  // A tank moved to another client cannot keep the old client's site.
  if (input.clientId && input.clientId !== before.clientId && input.siteId === undefined) changes.siteId = null
  if (input.shape && input.dimensions) {
    const computed = volumeFromDimensions(input.shape, input.dimensions)
    changes.shape = input.shape
    changes.dimensions = computed.dimensions
    changes.volumeLitres = computed.volumeLitres
  }
  if (!Object.keys(changes).length) return await getTankView(actor, id)
  const now = requestNow(event)
  // Under the write lock: a sign-off decided while this change waited for it counts.
  await writeTransaction(() => {
    // What a signed-off tank's certificate prints changes only by reopening or an amendment with a reason.
    const signed = currentApprovedSignOff(id)
    const signedChanges = signed ? signedFieldChanges(before, changes) : []
    if (signed && signedChanges.length && !input.amendmentReason) {
      const message = `This tank was signed off on ${signed.decidedAt?.slice(0, 10)}: ${signedFieldsInWords(signedChanges.map(c => c.field))} part of the signed record. Write a reason to amend it (the certificate will show the amendment), or reopen the sign-off.`
      throw createError({ statusCode: 409, statusMessage: message, message, data: { issues: [{ field: 'amendmentReason', message }], signedFields: signedChanges.map(c => c.field) } })
    }
    const updated = useDB().update(tanks).set(changes).where(eq(tanks.id, id)).returning().get()
    if (signed && signedChanges.length) {
      recordAmendment(useDB(), { signOffId: signed.id, tankId: id, by: actor.id, at: now, reason: input.amendmentReason!, changes: signedChanges })
      writeAudit(actor, { action: 'sign-off.amend', entity: 'sign_off', entityId: signed.id, before: Object.fromEntries(signedChanges.map(c => [c.field, c.before])), after: { ...Object.fromEntries(signedChanges.map(c => [c.field, c.after])), reason: input.amendmentReason } })
    }
    writeAudit(actor, { action: 'tank.update', entity: 'tank', entityId: id, before, after: updated })
  })
  await onTankDataChanged(id, { actor })
  return await getTankView(actor, id)
})
