import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { AUDIT_ACTION_GROUPS, AUDIT_ACTION_LABELS, auditActionLabel, auditChanges, auditValueText } from '../../../../shared/audit/words'

/** Every action code the server writes: `action: 'x.y'`, including both arms of a conditional. */
function actionsWritten(dir: string): Set<string> {
  const found = new Set<string>()
  for (const entry of readdirSync(dir, { withFileTypes: true, recursive: true })) {
    if (!entry.isFile() || !entry.name.endsWith('.ts')) continue
    const text = readFileSync(join(entry.parentPath, entry.name), 'utf8')
    for (const line of text.matchAll(/action: ([^,}]+)/g)) {
      for (const code of line[1]!.matchAll(/'([a-z-]+\.[a-z-]+)'/g)) found.add(code[1]!)
    }
  }
  return found
}

describe('the audit trail in plain words', () => {
  it('has words and a filter group for every action the server writes', () => {
    const written = [...actionsWritten(join(__dirname, '../../../../server'))]
    expect(written.length).toBeGreaterThan(20)
    expect(written.filter(code => !AUDIT_ACTION_LABELS[code])).toEqual([])
    expect(written.filter(code => !AUDIT_ACTION_GROUPS[code.split('.')[0]!])).toEqual([])
  })

  it('names actions in words and falls back to the code for one it does not know', () => {
    expect(auditActionLabel('reading.update')).toBe('Edited a test')
    expect(auditActionLabel('something.new')).toBe('something.new')
  })

  it('lists only the fields that changed, with readable names and values', () => {
    const before = { id: 'r1', updatedAt: '2026-01-01', ammoniaN: 0.41120000001, notes: null, pH: 8.1 }
    const after = { id: 'r1', updatedAt: '2026-01-02', ammoniaN: 0.2056, notes: 'Re-read the card', pH: 8.1 }
    expect(auditChanges(before, after)).toEqual([
      { field: 'ammoniaN', label: 'total ammonia (mg/L as N)', before: '0.411', after: '0.206' },
      { field: 'notes', label: 'notes', before: '—', after: 'Re-read the card' },
    ])
  })

  it('walks nested settings and reads each threshold as what it does, with its unit (THRESHOLD_SPECS)', () => {
    const changes = auditChanges(
      { reminders: { enabled: true, graceMinutes: 60 }, thresholds: { ammoniaZeroN: 0.05, temperatureMaxC: 29, calciumMinMgL: 380 } },
      { reminders: { enabled: false, graceMinutes: 60 }, thresholds: { ammoniaZeroN: 0.1, temperatureMaxC: 28, calciumMinMgL: 400 } },
    )
    expect(changes.map(c => `${c.label}: ${c.before} → ${c.after}`)).toEqual([
      'reminders: enabled: yes → no',
      'limit: Total ammonia at or below this reads as zero (mg/L as N): 0.05 → 0.1',
      'limit: Temperature above this is a caution (°C): 29 → 28',
      'limit: Stony corals wait for calcium at or above this (mg/L): 380 → 400',
    ])
  })

  it('lists what a creation set and what a deletion removed', () => {
    expect(auditChanges(null, { name: 'Lounge reef' })).toEqual([{ field: 'name', label: 'name', before: '—', after: 'Lounge reef' }])
    expect(auditChanges({ role: 'aquarist' }, null)).toEqual([{ field: 'role', label: 'role', before: 'aquarist', after: '—' }])
  })

  it('never shows a password hash, and writes booleans and empties plainly', () => {
    expect(auditChanges({ passwordHash: 'x' }, { passwordHash: 'y' })).toEqual([])
    expect(auditValueText(true)).toBe('yes')
    expect(auditValueText('')).toBe('—')
    expect(auditValueText([1, 2])).toBe('[1,2]')
  })
})
