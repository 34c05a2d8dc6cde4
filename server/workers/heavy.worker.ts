/**
 * The heavy-work pool's worker entry (server/utils/heavy-work.ts runs its tasks by name).
 * Built on its own into .output/server/workers/heavy.worker.mjs by scripts/build-workers.mjs.
 */
export { readingImport } from './reading-import'
export { tankVerdict } from './tank-verdict'
export { certificatePdf } from './certificate'
