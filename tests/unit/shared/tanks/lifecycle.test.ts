import { describe, expect, it } from 'vitest'
import { TANK_LIFECYCLE, TANK_TRIGGERS, checkTransition, triggersFrom, type TankTrigger } from '../../../../shared/tanks/lifecycle'
import { ROLES, TANK_STATUSES, type TankStatus } from '../../../../shared/vocabulary'

/** Follows a path of triggers from `start`, each caused by `by`; the statuses passed through. */
function walk(start: TankStatus, steps: [TankTrigger, Parameters<typeof checkTransition>[2]][]): TankStatus[] {
  const seen: TankStatus[] = [start]
  for (const [trigger, by] of steps) {
    const result = checkTransition(seen.at(-1)!, trigger, by)
    if (!result.ok) throw new Error(result.message)
    seen.push(result.to)
  }
  return seen
}

describe('the tank lifecycle table', () => {
  it('carries a tank from the plan to stocking by the usual path', () => {
    expect(walk('planned', [
      ['stage-started', 'aquarist'],
      ['water-filled', 'aquarist'],
      ['sign-off-requested', 'aquarist'],
      ['sign-off-approved', 'supervisor'],
      ['stocking-started', 'aquarist'],
    ])).toEqual(['planned', 'building', 'cycling', 'cycled', 'signed-off', 'stocking'])
  })

  it('sends a returned or reopened cycle back to cycling', () => {
    expect(walk('cycling', [['sign-off-requested', 'admin'], ['sign-off-returned', 'supervisor']])).toEqual(['cycling', 'cycled', 'cycling'])
    expect(walk('signed-off', [['sign-off-reopened', 'supervisor']])).toEqual(['signed-off', 'cycling'])
    expect(walk('stocking', [['sign-off-reopened', 'admin']])).toEqual(['stocking', 'cycling'])
  })

  it('lets a tank filled before any stage was started go straight to cycling', () => {
    expect(checkTransition('planned', 'water-filled', 'aquarist')).toEqual({ ok: true, to: 'cycling' })
  })

  it('moves a signed-off tank to stocking when livestock is logged, as Tidewright\'s own reaction', () => {
    expect(checkTransition('signed-off', 'livestock-logged', 'system')).toEqual({ ok: true, to: 'stocking' })
    expect(checkTransition('signed-off', 'livestock-logged', 'client')).toMatchObject({ ok: false, refusal: 'role' })
  })

  it('refuses a trigger from a status it does not apply to', () => {
    expect(checkTransition('building', 'sign-off-approved', 'supervisor')).toMatchObject({ ok: false, refusal: 'status' })
    expect(checkTransition('planned', 'stocking-started', 'admin')).toMatchObject({ ok: false, refusal: 'status' })
    expect(checkTransition('stocking', 'livestock-logged', 'system')).toMatchObject({ ok: false, refusal: 'status' })
    expect(checkTransition('cycled', 'stage-started', 'aquarist')).toMatchObject({ ok: false, refusal: 'status' })
  })

  it('refuses a trigger from a role that may not cause it, before looking at the status', () => {
    expect(checkTransition('cycled', 'sign-off-approved', 'aquarist')).toMatchObject({ ok: false, refusal: 'role' })
    expect(checkTransition('cycling', 'sign-off-requested', 'supervisor')).toMatchObject({ ok: false, refusal: 'role' })
    expect(checkTransition('planned', 'sign-off-approved', 'client')).toMatchObject({ ok: false, refusal: 'role' })
  })

  it('never lets a client change a tank\'s status', () => {
    for (const trigger of TANK_TRIGGERS) {
      for (const from of TANK_STATUSES) expect(checkTransition(from, trigger, 'client').ok).toBe(false)
    }
  })

  it('names only real statuses and roles, and never leads back to planned', () => {
    for (const transition of Object.values(TANK_LIFECYCLE)) {
      expect(TANK_STATUSES).toContain(transition.to)
      expect(transition.to).not.toBe('planned')
      for (const from of transition.from) expect(TANK_STATUSES).toContain(from)
      for (const by of transition.by) expect([...ROLES, 'system']).toContain(by)
    }
  })

  it('reaches every status from planned', () => {
    const reached = new Set<TankStatus>(['planned'])
    for (let changed = true; changed;) {
      changed = false
      for (const t of Object.values(TANK_LIFECYCLE)) {
        if (t.from.some(f => reached.has(f)) && !reached.has(t.to)) { reached.add(t.to); changed = true }
      }
    }
    expect([...reached].sort()).toEqual([...TANK_STATUSES].sort())
  })

  it('lists the triggers that apply to each status', () => {
    expect(triggersFrom('planned')).toEqual(['stage-started', 'water-filled'])
    expect(triggersFrom('cycled')).toEqual(['sign-off-requested', 'sign-off-approved', 'sign-off-returned'])
    expect(triggersFrom('cycling')).toEqual(['sign-off-requested', 'sign-off-approved', 'sign-off-returned'])
    expect(triggersFrom('stocking')).toEqual(['sign-off-reopened'])
  })
})
