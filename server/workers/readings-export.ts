/**
 * The CSV export of a tank with a long history, in a worker thread of the heavy-work pool
 * (server/utils/heavy-work.ts): reading and writing 100,000 tests takes seconds that the
 * request loop, serving every company, must not spend. Framework-free; its entry is heavy.worker.ts.
 */
import { readingsCsv } from '#server/domain/readings/export'
import { workerConnection } from './connection'

export interface ReadingsExportTask {
  dbPath: string
  tankId: string
}

export function readingsExport(task: ReadingsExportTask): string {
  return readingsCsv(workerConnection(task.dbPath), task.tankId)
}
