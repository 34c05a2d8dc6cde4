/**
 * The evidence's page of tests and events as JSON text, made in a worker thread of the
 * heavy-work pool (server/utils/heavy-work.ts) with the thread's own connection: a thousand
 * tests read and written out is the longest piece of the evidence page, and the request loop
 * serves every company. Framework-free; its entry is heavy.worker.ts.
 */
import { evidencePageText, type EvidencePageText } from '#server/domain/sign-off/evidence-page'
import { workerConnection } from './connection'

export interface EvidencePageTask {
  dbPath: string
  tankId: string
  page: number
}

export function evidencePage(task: EvidencePageTask): EvidencePageText {
  return evidencePageText(workerConnection(task.dbPath), task.tankId, task.page)
}
