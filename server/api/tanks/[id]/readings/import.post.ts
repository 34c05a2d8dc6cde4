import { IdParams } from '#shared/schemas/common'
import { importTooLargeMessage } from '#shared/readings/limits'
import { ReadingImportSchema } from '#shared/schemas/reading'
import type { ImportPreview } from '#shared/types/readings'

/**
 * POST /api/tanks/:id/readings/import — CSV import of readings, read in the kit basis chosen
 * (left out: as the file's headers say, else the tank's remembered kit basis, like the
 * form). With `dryRun: true` (the default) nothing is written: the answer is the header,
 * the column mapping used, a preview and every row's errors. With `dryRun: false` the
 * valid rows are written in one transaction; rows already imported (same normalised
 * content) are skipped, rows past a day's TESTS_PER_TANK_PER_DAY are refused per row, and
 * the verdict is refreshed once at the end, before the answer. 413 for a file of more than
 * MAX_IMPORT_ROWS rows. The work (the verdict's engine run too) runs in the heavy-work pool,
 * off the request loop. Returns ImportPreview.
 */
export default defineEventHandler(async (event): Promise<ImportPreview> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const input = await readValidatedBody(event, valid(ReadingImportSchema))
  const locked = tankLockedUntil(tank.id)
  const result = await runReadingImport({
    tankId: tank.id,
    actor: { id: actor.id, organisationId: actor.organisationId },
    input,
    kit: tank.kitBasis,
    lockedMs: locked ? Date.parse(locked) : null,
    nowMs: Date.now(),
  })
  if (result.kind === 'too-many-rows') {
    const message = importTooLargeMessage()
    throw createError({ statusCode: 413, statusMessage: message, message })
  }
  if (result.kind === 'lock-moved') {
    const message = 'The tank was signed off while the file was being read, so nothing was imported. Import it again: tests inside the signed period will be refused row by row.'
    throw createError({ statusCode: 409, statusMessage: message, message })
  }
  if (result.kind === 'field-issues') fieldError(result.issues)
  const { preview } = result
  // How long the import held the database's write lock (every other write waits that long): the bench reads it.
  if (!input.dryRun) setResponseHeader(event, 'Server-Timing', `import-write-lock;dur=${result.lockHeldMs.toFixed(1)}`)
  // One verdict refresh for the whole file, awaited so the answer comes once the verdict and its
  // alerts match the file; the engine runs in the pool, so a long history holds up no other request.
  if (preview.inserted > 0) await onTankDataChanged(tank.id, { actor })
  return preview
})
