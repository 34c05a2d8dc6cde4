/**
 * The heavy-work pool's worker entry (server/utils/heavy-work.ts runs its tasks by name).
 * Built on its own into .output/server/workers/heavy.worker.mjs by scripts/build-workers.mjs.
 * The certificate's PDF code (fonts, layout) is loaded on its first task: the thread starts
 * without it, and the CSV import and the verdicts never need it.
 */
import type { CertificateTask } from './certificate'

export { evidencePage } from './evidence-page'
export { readingImport } from './reading-import'
export { readingsExport } from './readings-export'
export { signOffDecision } from './sign-off-decision'
export { signOffEvaluation } from './sign-off-evaluation'
export { tankVerdict } from './tank-verdict'

export async function certificatePdf(task: CertificateTask): Promise<Uint8Array> {
  const { certificatePdf: render } = await import('./certificate')
  return render(task)
}
