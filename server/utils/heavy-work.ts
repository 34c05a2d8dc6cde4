/**
 * The heavy-work pool: worker threads (piscina) for the work that would otherwise hold the
 * one request loop every company is served from (a 100,000-row CSV import takes seconds).
 * One thread fewer than the machine has cores, at least one, so requests keep a core. Its
 * tasks: the CSV import, the engine run for the evidence page, for the verdict refresh and for
 * a sign-off request on a tank with a long history, such a tank's sign-off decision (evaluated
 * and stored there) and CSV export, the evidence's page of tests and events as text, and the
 * certificate's PDF.
 *
 * Each worker entry is built beside the server (scripts/build-workers.mjs): found by
 * looking up from this chunk's own file, so a moved .output keeps working. There is no
 * in-process fallback: a build without its workers fails loudly on the first import.
 */
import { existsSync } from 'node:fs'
import { availableParallelism } from 'node:os'
import { dirname, join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { setFlagsFromString } from 'node:v8'
import { Piscina } from 'piscina'
import type { TankEvaluation } from '#server/db/verdicts'
import type { AppendedTest } from '#server/domain/readings/engine-input-cache'
import type { DecisionResult } from '#server/domain/sign-off/commands'
import type { SignOffVerdict } from '#server/domain/sign-off/evaluation'
import { refusalAgain } from '#server/domain/sign-off/refusal-transfer'
import type { EvidencePageText } from '#server/domain/sign-off/evidence-page'
import type { CertificateTask } from '#server/workers/certificate'
import type { EvidencePageTask } from '#server/workers/evidence-page'
import type { ReadingImportResult, ReadingImportTask } from '#server/workers/reading-import'
import type { ReadingsExportTask } from '#server/workers/readings-export'
import type { SignOffDecisionOutcome, SignOffDecisionTask } from '#server/workers/sign-off-decision'
import type { SignOffEvaluationTask } from '#server/workers/sign-off-evaluation'
import type { TankVerdictTask } from '#server/workers/tank-verdict'

let pool: Piscina | undefined

/** Young generation of each pool thread, in MB: three semi-spaces of 4 MB. */
const YOUNG_GENERATION_MB = 12

/** The built worker file `name`.mjs, searched for in workers/ beside this chunk and in the folders above it (Nitro nests chunks by route). */
function workerFile(name: string): string {
  let dir = dirname(fileURLToPath(import.meta.url))
  for (let i = 0; i < 10 && dirname(dir) !== dir; i++) {
    const candidate = join(dir, 'workers', `${name}.mjs`)
    if (existsSync(candidate)) return candidate
    dir = dirname(dir)
  }
  throw new Error(`The worker ${name}.mjs was not built beside the server (run nuxt build).`)
}

/**
 * V8 flag set once, before the pool's first thread starts: no allocation-site pretenuring. With
 * it, a tank's history read and kept whole in a pool thread (every test outlives its collections)
 * taught V8 to allocate the tests that code makes straight into the old generation; a long
 * history streamed through the same code afterwards (history-stream.ts: each test is let go at
 * once) then left every test there as garbage until a full collection, some 17 MB for 100,000
 * tests, so the server's memory grew with the length of the history. V8 flags are the
 * process's, not a thread's: this is set at server start (30.heavy-pool.ts), before any request.
 */
const HEAP_FLAGS = '--no-allocation-site-pretenuring'

function heavyPool(): Piscina {
  if (!pool) setFlagsFromString(HEAP_FLAGS)
  pool ??= new Piscina({
    filename: workerFile('heavy.worker'),
    maxThreads: Math.max(1, availableParallelism() - 1),
    minThreads: 1,
    idleTimeout: 60_000,
    // A smaller young generation than V8's default for a thread (semi-spaces of 4 MB, not 16):
    // V8 enlarges it each time what outlived its collections adds up to its size, so an import
    // or a long history's engine run grew it to its full size the longer it ran (semi-spaces of
    // 8 MB after 100,000 rows, 4 MB after 10,000: 8 MiB more resident for the longer file), for
    // no measured gain in time.
    resourceLimits: { maxYoungGenerationSizeMb: YOUNG_GENERATION_MB },
  })
  return pool
}

/**
 * Starts the pool's first thread now (server start) rather than on the first task: starting a
 * thread and loading the worker's code take a few hundred ms that a CSV import would otherwise
 * wait for. A build without its workers still fails on the first import, as before.
 */
export function warmHeavyPool(): void {
  heavyPool()
}

const dbPath = () => resolve(useRuntimeConfig().dbPath)

/** Runs a CSV import (plan, day caps, write and audit line) in the pool; see server/workers/reading-import.ts. */
export function runReadingImport(task: Omit<ReadingImportTask, 'dbPath'>): Promise<ReadingImportResult> {
  return heavyPool().run({ ...task, dbPath: dbPath() } satisfies ReadingImportTask, { name: 'readingImport' })
}

/**
 * The engine's verdict and forecast for the tank as its data stands now, computed in the pool; null
 * when there is no such tank. `appended`: the tests saved since its last evaluation, in the order they
 * were saved, which the pool's kept copy takes in place.
 */
export function evaluateOffLoop(tankId: string, now: Date, appended: readonly AppendedTest[] = []): Promise<TankEvaluation | null> {
  return heavyPool().run({ tankId, nowMs: now.getTime(), dbPath: dbPath(), appended } satisfies TankVerdictTask, { name: 'tankVerdict' })
}

/**
 * What a sign-off request rests on, made in the pool: the tank's data revision, then its verdict as
 * of `now` made from its history read anew, without the input, which a request does not record;
 * the tank's profile and thresholds the verdict was made under come back with it.
 */
export function signOffVerdictOffLoop(tankId: string, now: Date): Promise<SignOffVerdict | null> {
  return heavyPool().run({ tankId, nowMs: now.getTime(), dbPath: dbPath() } satisfies SignOffEvaluationTask, { name: 'signOffEvaluation' })
}

/**
 * A sign-off decision made wholly in the pool (server/workers/sign-off-decision.ts): evaluated and
 * stored with its input there; back comes the decided row only. A refusal is thrown here as its
 * own class (SignOffRefused, EvaluationOutdated, TankStatusRefused); null when there is no such tank.
 */
export async function decideSignOffOffLoop(task: Omit<SignOffDecisionTask, 'dbPath'>): Promise<DecisionResult | null> {
  const outcome: SignOffDecisionOutcome = await heavyPool().run({ ...task, dbPath: dbPath() } satisfies SignOffDecisionTask, { name: 'signOffDecision' })
  if (outcome.kind === 'refused') throw refusalAgain(outcome.refusal)
  return outcome.kind === 'decided' ? outcome.result : null
}

/** The evidence's page of a tank's tests and events as JSON text (server/domain/sign-off/evidence-page.ts), read and written in the pool. */
export function evidencePageOffLoop(tankId: string, page: number): Promise<EvidencePageText> {
  return heavyPool().run({ tankId, page, dbPath: dbPath() } satisfies EvidencePageTask, { name: 'evidencePage' })
}

/** A tank's readings as CSV text (server/domain/readings/export.ts), written in the pool. */
export function exportReadingsOffLoop(tankId: string): Promise<string> {
  return heavyPool().run({ tankId, dbPath: dbPath() } satisfies ReadingsExportTask, { name: 'readingsExport' })
}

/** The sign-off certificate's PDF bytes, rendered in the pool; its final tests read there from the input `signOffId` was decided on. */
export async function renderCertificateOffLoop(facts: CertificateTask['facts'], signOffId: string): Promise<Uint8Array> {
  const task: CertificateTask = { facts, fonts: await certificateFonts(), dbPath: dbPath(), signOffId }
  return heavyPool().run(task, { name: 'certificatePdf' })
}
