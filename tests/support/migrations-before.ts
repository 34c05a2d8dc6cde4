/**
 * The migrations folder as it stood before migration `index`: its files and a journal of the
 * ones before it, written under `dir`, for a test that builds a database as an older Tidewright
 * left it and then migrates it.
 */
import { cpSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join, resolve } from 'node:path'

export function migrationsBefore(dir: string, index: number): string {
  const folder = join(dir, `drizzle-before-${index}`)
  mkdirSync(join(folder, 'meta'), { recursive: true })
  const journal = JSON.parse(readFileSync(resolve('drizzle/meta/_journal.json'), 'utf8')) as { entries: { idx: number, tag: string }[] }
  const earlier = journal.entries.filter(e => e.idx < index)
  if (earlier.map(e => e.idx).join() !== [...Array(index).keys()].join()) throw new Error(`the journal does not hold migrations 0 to ${index - 1} in order`)
  for (const entry of earlier) cpSync(resolve('drizzle', `${entry.tag}.sql`), join(folder, `${entry.tag}.sql`))
  writeFileSync(join(folder, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: earlier }))
  return folder
}
