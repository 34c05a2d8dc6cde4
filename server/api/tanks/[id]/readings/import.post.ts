import { IdParams } from '#shared/schemas/common'
import { ReadingImportSchema } from '#shared/schemas/reading'
import type { ImportPreview } from '#shared/types/readings'

/**
 * POST /api/tanks/:id/readings/import — CSV import of readings, read in the kit basis chosen
 * (left out: as the file's headers say, else the tank's remembered kit basis, like the
 * form). With `dryRun: true` (the
 * default) nothing is written: the answer is the header, the column mapping used, a
 * preview and every row's errors. With `dryRun: false` the valid rows are written in one
 * transaction; rows already imported (same normalised content) are skipped, and the
 * verdict is refreshed once at the end. Returns ImportPreview.
 */
export default defineEventHandler(async (event): Promise<ImportPreview> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(ReadingImportSchema))
  const plan = planImport(tank.id, input, tank.kitBasis)
  if (input.dryRun) return toPreview(plan, true, 0)
  const inserted = writeImport(tank.id, actor, plan)
  // One verdict refresh for the whole file, run as soon as the answer has been handed to
  // the socket. The engine is synchronous, so it still finishes before this process
  // serves another request: nobody reads a stale verdict, and the importer does not wait.
  if (inserted > 0) afterResponse(event, () => onTankDataChanged(tank.id, { actor }))
  return toPreview(plan, false, inserted)
})
