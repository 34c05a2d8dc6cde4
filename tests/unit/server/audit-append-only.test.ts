import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, describe, expect, it } from 'vitest'
import { migrateDatabase, openDatabase } from '../../../server/db/connection'
import { auditLog } from '../../../server/db/schema'

const dir = mkdtempSync(join(tmpdir(), 'tidewright-audit-'))
afterAll(() => rmSync(dir, { recursive: true, force: true }))

function sourceFiles(root: string): string[] {
  return readdirSync(root).flatMap((name) => {
    const path = join(root, name)
    return statSync(path).isDirectory() ? sourceFiles(path) : /\.(ts|mjs|js)$/.test(name) ? [path] : []
  })
}

describe('the audit log', () => {
  it('refuses UPDATE and DELETE in the database itself (migrated SQLite file)', () => {
    const db = openDatabase(join(dir, 'audit.sqlite'))
    migrateDatabase(db)
    db.insert(auditLog).values({ organisationId: 'org', action: 'test.write', entity: 'test' }).run()
    expect(() => db.$client.prepare('UPDATE audit_log SET action = ?').run('rewritten')).toThrow(/append-only/)
    expect(() => db.$client.prepare('DELETE FROM audit_log').run()).toThrow(/append-only/)
    expect(db.select().from(auditLog).all().map(r => r.action)).toEqual(['test.write'])
    db.$client.close()
  })

  it('has no update or delete path in server code', () => {
    const offenders = sourceFiles('server').filter((file) => {
      const text = readFileSync(file, 'utf8')
      return /\.(update|delete)\(\s*(auditLog|tables\.auditLog)\b/.test(text) || /(UPDATE|DELETE\s+FROM)\s+[`"']?audit_log/i.test(text)
    })
    expect(offenders).toEqual([])
    // The check itself can fail: it recognises the pattern it looks for.
    expect(/\.(update|delete)\(\s*(auditLog|tables\.auditLog)\b/.test('db.update(auditLog).set({})')).toBe(true)
  })
})
