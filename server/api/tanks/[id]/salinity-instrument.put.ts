import { IdParams } from '#shared/schemas/common'
import { SalinityInstrumentSchema } from '#shared/schemas/salinity-instrument'
import { rememberSalinityInstrument, salinityInstrumentOf } from '#server/domain/instruments/salinity'

/**
 * PUT /api/tanks/:id/salinity-instrument — remembers how the signed-in person measures this
 * tank's salinity (mode and scale), for every device they test from. Audited with before and
 * after when it changes. Returns { instrument }.
 */
export default defineEventHandler(async (event) => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const instrument = await readValidatedBody(event, valid(SalinityInstrumentSchema))
  const before = salinityInstrumentOf(useDB(), actor.id, tank.id)
  if (before?.mode !== instrument.mode || before.sgBasis !== instrument.sgBasis) {
    await auditedChange(actor,
      tx => rememberSalinityInstrument(tx, actor.id, tank.id, instrument),
      () => ({ action: 'preferences.salinity-instrument', entity: 'tank', entityId: tank.id, before, after: instrument }))
  }
  return { instrument }
})
