import { IdParams } from '#shared/schemas/common'
import { ReadingImportQuerySchema, ReadingImportSchema } from '#shared/schemas/reading'
import type { ImportPreview } from '#shared/types/readings'
import type { H3Event } from 'h3'
import type { Actor } from '#server/utils/access'
import type { ImportFileSource, ReadingImportTask } from '#server/workers/reading-import'

/**
 * POST /api/tanks/:id/readings/import — CSV import of readings, read in the kit basis chosen
 * (left out: as the file's headers say, else the tank's remembered kit basis, like the
 * form). The file comes one of two ways, read by the same worker code: as the request's body
 * (Content-Type: text/csv, the options in the query string: ReadingImportQuerySchema),
 * streamed to a temporary file and read from there a piece at a time, so memory does not grow
 * with the file (the form and the bench send it so); or as JSON `{ csv, ...options }`
 * (ReadingImportSchema), for API clients. With `dryRun: true` (the default) nothing is
 * written: the answer is the header, the column mapping used, a preview and the first rows'
 * errors (all counted). With `dryRun: false` the valid rows are written in one transaction;
 * rows already imported (same normalised content) are skipped, rows past a day's
 * TESTS_PER_TANK_PER_DAY are refused per row, and the verdict is refreshed once at the end,
 * before the answer. 413 for a file of more than MAX_IMPORT_ROWS rows or past the body limit.
 * The work (the verdict's engine run too) runs in the heavy-work pool, off the request loop.
 * Returns ImportPreview.
 */
export default defineEventHandler(async (event): Promise<ImportPreview> => {
  const actor = await requireActor(event, ENTRY_ROLES)
  const { id } = await getValidatedRouterParams(event, valid(IdParams))
  const tank = requireVisibleTank(actor, id)
  const run = (input: ReadingImportTask['input'], file: ImportFileSource) => importFile(event, tank, actor, input, file)
  if (sendsCsvBody(event)) {
    const input = await getValidatedQuery(event, valid(ReadingImportQuerySchema))
    return withCsvUpload(event, path => run(input, { path }))
  }
  const { csv, ...input } = await readValidatedBody(event, valid(ReadingImportSchema))
  return run(input, { text: csv })
})

/** Runs the import in the pool and shapes its answer, the file sent either way. */
async function importFile(event: H3Event, tank: { id: string, kitBasis: ReadingImportTask['kit'] }, actor: Actor, input: ReadingImportTask['input'], file: ImportFileSource): Promise<ImportPreview> {
  const locked = tankLockedUntil(tank.id)
  const result = await runReadingImport({
    tankId: tank.id,
    actor: { id: actor.id, organisationId: actor.organisationId },
    input,
    file,
    kit: tank.kitBasis,
    lockedMs: locked ? Date.parse(locked) : null,
    nowMs: Date.now(),
  })
  if (result.kind === 'too-many-rows') importTooLarge()
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
}
