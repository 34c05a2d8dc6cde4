/**
 * The CSV import's worker steps run in this process on a seeded database, for profiling:
 * `node --cpu-prof --import tsx bench/bulk-profile.ts` (after nuxt build: it runs the built
 * worker file). Prints each step's wall and CPU time (CPU time moves less when other work
 * shares the machine), the raw insert loop's on a copy of the same database, and the process's
 * memory, and what the import step added to it. The file is read from disk as the route's
 * streamed way leaves it (a temporary file the worker reads a piece at a time).
 * BULK_PROFILE_ROWS sets the file's length (default 100,000); BULK_PROFILE_SOURCE=text hands the
 * worker the file's text instead, as the JSON way does.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { performance } from 'node:perf_hooks'
import { pathToFileURL } from 'node:url'
import { setFlagsFromString } from 'node:v8'
import { runInNewContext } from 'node:vm'
import { seededDatabase } from '../tests/support/own-server'
import { bulkCsv, rawInsertFloor } from './bulk.bench'

const ROWS = Number(process.env.BULK_PROFILE_ROWS ?? 100_000)
const FROM_TEXT = process.env.BULK_PROFILE_SOURCE === 'text'
// A collection on demand, to tell what the import keeps from the garbage it leaves for later.
setFlagsFromString('--expose-gc')
const collect = runInNewContext('gc') as () => void
const mib = (n: number) => (n / 1048576).toFixed(0)
const mem = () => {
  const m = process.memoryUsage()
  return `rss ${mib(m.rss)} heap ${mib(m.heapUsed)} peak rss ${mib(process.resourceUsage().maxRSS * 1024)} MiB`
}

/** Resident and peak resident memory of this process, in bytes (Linux). */
function residentBytes(): { rss: number, peak: number } {
  const status = readFileSync('/proc/self/status', 'utf8')
  const field = (name: string) => Number(new RegExp(`${name}:\\s+(\\d+)`).exec(status)?.[1] ?? Number.NaN) * 1024
  return { rss: field('VmRSS'), peak: field('VmHWM') }
}

/** Runs `step`, printing its wall and CPU milliseconds; returns its value and CPU ms. */
function timed<T>(name: string, step: () => T): { value: T, cpuMs: number } {
  const wall = performance.now()
  const cpu = process.cpuUsage()
  const value = step()
  const used = process.cpuUsage(cpu)
  const cpuMs = (used.user + used.system) / 1000
  console.log(`${name}: ${(performance.now() - wall).toFixed(0)} ms wall, ${cpuMs.toFixed(0)} ms CPU; ${mem()}`)
  return { value, cpuMs }
}

const dir = mkdtempSync(join(tmpdir(), 'tidewright-bulk-profile-'))
try {
  const { dbPath, fixtures } = await seededDatabase(dir)
  const worker = await import(pathToFileURL(resolve('.output/server/workers/heavy.worker.mjs')).href)
  const { csv, rows } = bulkCsv(ROWS)
  const tankId = fixtures.other.tankId
  const csvPath = join(dir, 'upload.csv')
  writeFileSync(csvPath, csv)

  const floorWall = performance.now()
  const floor = await rawInsertFloor(dbPath, join(dir, 'floor.sqlite'), tankId, rows)
  console.log(`raw insert loop: ${(performance.now() - floorWall).toFixed(0)} ms wall with the copy, ${(floor.cpuSeconds * 1000).toFixed(0)} ms CPU in the loop; ${mem()}`)

  collect()
  // The peak so far (the file made, the floor's loop) is forgotten: what follows is the import's own.
  writeFileSync('/proc/self/clear_refs', '5')
  const before = { ...process.memoryUsage(), ...residentBytes() }
  const imported = timed('import', () => worker.readingImport({
    dbPath, tankId, actor: { id: fixtures.other.aquaristId, organisationId: fixtures.other.organisationId },
    input: { dryRun: false, basis: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, temperatureUnit: 'C', salinityMode: 'practical', mapping: {} },
    file: FROM_TEXT ? { text: csv } : { path: csvPath },
    kit: { ammonia: 'N', nitrite: 'N', nitrate: 'N' }, lockedMs: null, nowMs: Date.now(),
  }))
  const after = process.memoryUsage()
  collect()
  const kept = process.memoryUsage().heapUsed - before.heapUsed
  console.log(`import step added: rss ${mib(after.rss - before.rss)}, peak rss ${mib(residentBytes().peak - before.rss)}, heap ${mib(after.heapUsed - before.heapUsed)} (kept after a collection ${(kept / 1048576).toFixed(1)}) MiB`)
  collect()
  writeFileSync('/proc/self/clear_refs', '5')
  const beforeVerdict = { ...process.memoryUsage(), ...residentBytes() }
  const verdict = timed('verdict', () => worker.tankVerdict({ dbPath, tankId, nowMs: Date.now(), appended: [] }))
  collect()
  console.log(`verdict step added: peak rss ${mib(residentBytes().peak - beforeVerdict.rss)}, heap kept after a collection ${((process.memoryUsage().heapUsed - beforeVerdict.heapUsed) / 1048576).toFixed(1)} MiB (the tank's kept history)`)
  console.log(`inserted ${imported.value.preview?.inserted}, write lock held ${imported.value.lockHeldMs?.toFixed(0)} ms, errors ${imported.value.preview?.errorRows}, phase ${verdict.value?.verdict?.phase}; CPU ratio import / floor ${(imported.cpuMs / (floor.cpuSeconds * 1000)).toFixed(2)}, with verdict ${((imported.cpuMs + verdict.cpuMs) / (floor.cpuSeconds * 1000)).toFixed(2)}; peak rss ${mib(process.resourceUsage().maxRSS * 1024)} MiB`)
}
finally {
  rmSync(dir, { recursive: true, force: true })
}
