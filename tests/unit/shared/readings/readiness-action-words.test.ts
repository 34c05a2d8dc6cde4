/**
 * A client reads why animals wait, and what to do next, in plain words; the engine's text (in
 * their kit's units) is the "why" and the engine's verdict is untouched. Every readiness rule and
 * every action kind has client words, so a new one cannot reach a client in the aquarist's terms.
 */
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { evaluateCycle } from '../../../../shared/cycle'
import { ACTION_KINDS } from '../../../../shared/cycle/actions'
import { READINESS_RULES } from '../../../../shared/cycle/registry'
import { LIVESTOCK_GROUPS } from '../../../../shared/vocabulary'
import { actionForClient, CLIENT_ACTION_WORDS, PLAIN_ACTION_KINDS } from '../../../../shared/readings/action-words'
import { blockerForClient, blockerRule, CLIENT_BLOCKER_WORDS } from '../../../../shared/readings/readiness-words'
import type { Reader } from '../../../../shared/readings/reader-words'
import { tankArb, toInput } from '../cycle/arbitraries'
import { crashAfterLivestock, fishInWithSpike, missingWeek, neverFed, nitriteStall, textbookFishless, waterChangeMidCycle } from '../cycle/scenarios'

const NH3_KIT = { ammonia: 'NH3', nitrite: 'NO2', nitrate: 'NO3' } as const
const usClient: Reader = { units: 'us', when: ms => new Date(ms).toISOString(), kit: { basis: NH3_KIT, exactN: [] } }
const AQUARIST_TERMS = /mg\/L as N|EPA|un-ionized|criterion|NH3-N|common practice/

/** Every verdict the scenario logs give, day by day: the engine's own blockers and actions. */
function scenarioVerdicts() {
  const logs = [textbookFishless(), fishInWithSpike(), nitriteStall(), neverFed(), missingWeek(), waterChangeMidCycle(), crashAfterLivestock()]
  return logs.flatMap(log => Array.from({ length: 70 }, (_, day) => day + 1).map(day => evaluateCycle(log.input(day, 23))))
}

// The kinds the rules' sources propose: a kind added there without client words fails below.
function kindsInRuleSources(): string[] {
  const dir = join(__dirname, '../../../../shared/cycle/rules')
  const kinds = readdirSync(dir).flatMap(f => [...readFileSync(join(dir, f), 'utf8').matchAll(/kind: '([a-z-]+)'/g)].map(m => m[1]!))
  return [...new Set(kinds)]
}

describe('livestock blockers in a client\'s words', () => {
  it('has words for every readiness rule, and none for a rule that does not exist', () => {
    expect(Object.keys(CLIENT_BLOCKER_WORDS).sort()).toEqual(READINESS_RULES.map(r => r.id).sort())
  })

  it('knows which rule wrote every blocker the engine gives, in the scenarios and in generated tanks', () => {
    const blockers = new Set<string>()
    for (const v of scenarioVerdicts()) for (const g of LIVESTOCK_GROUPS) v.readiness[g].blockers.forEach(b => blockers.add(b))
    fc.assert(fc.property(tankArb, (k) => {
      const v = evaluateCycle(toInput(k))
      for (const g of LIVESTOCK_GROUPS) v.readiness[g].blockers.forEach(b => blockers.add(b))
    }), { numRuns: 300, seed: 16 })
    const unknown = [...blockers].filter(b => blockerRule(b) === null)
    expect(unknown).toEqual([])
    // The runs above reach most rules, so the forms are checked against the engine's real texts.
    const reached = new Set([...blockers].map(blockerRule))
    for (const id of ['readiness.cycle-complete', 'readiness.fish-already-in', 'readiness.no-danger', 'readiness.coral-wait', 'readiness.reef-chemistry', 'readiness.ph']) expect(reached, id).toContain(id)
  })

  it('says a blocker plainly, with the engine\'s text in the client\'s units as the why', () => {
    const nitrate = 'Nitrate is 12 mg/L as N (about 53.1 ppm as NO3) (test of 2026-12-01 08:00 UTC), above 4.5 mg/L as N (about 19.9 ppm as NO3) for invertebrates: change water first.'
    const words = blockerForClient(nitrate, usClient)
    expect(words.ruleId).toBe('readiness.nitrate')
    expect(words.text).toBe('Nitrate is too high for these animals yet: a water change brings it down.')
    expect(words.why).toContain('ppm as NO3')
    expect(words.why).not.toContain('mg/L as N')
    expect(blockerForClient('Alkalinity has never been tested; stony corals need it at 7-11 dKH.', usClient).text).toBe('Alkalinity has not been tested yet: stony corals need it tested, and in range, first.')
    expect(blockerForClient('Calcium is 350 mg/L (test of 2026-12-01 08:00 UTC), outside 380-450 mg/L.', usClient).text).toMatch(/^Calcium is outside the range stony corals need/)
  })

  it('shows a plain blocker, or one in no known form, restated and with no why', () => {
    expect(blockerForClient('Corals go in only after the tank is ready for fish.', usClient)).toEqual({ ruleId: 'readiness.fish-first', text: 'Corals go in only after the tank is ready for fish.', why: null })
    expect(blockerForClient('Something an older rule set said.', usClient)).toEqual({ ruleId: null, text: 'Something an older rule set said.', why: null })
  })

  it('writes no sentence in the aquarist\'s terms', () => {
    const samples = ['Not yet: x', 'Fish are already in the tank', 'Not while this is unresolved: x', 'Salinity is 30', 'Temperature is 33 C', 'Soft corals wait 30 days after the cycle completed (x)', 'Stony corals need salinity held', 'Alkalinity has never been tested', 'Magnesium is 1000', 'Nitrate is 12', 'Phosphate is 2', 'pH has not been tested', 'pH is 7', '3 animals went in on x; more fish wait until y']
    for (const sample of samples) {
      const id = blockerRule(sample)
      expect(id, sample).not.toBeNull()
      const text = CLIENT_BLOCKER_WORDS[id!]!.say(sample)
      expect(text, sample).toBeTruthy()
      expect(text, sample).not.toMatch(AQUARIST_TERMS)
    }
  })
})

describe('actions in a client\'s words', () => {
  it('has words for every action kind, or lists it as already plain, and not both', () => {
    const known = [...Object.keys(CLIENT_ACTION_WORDS), ...PLAIN_ACTION_KINDS]
    expect([...known].sort()).toEqual([...ACTION_KINDS].sort())
    for (const kind of kindsInRuleSources()) expect(known, kind).toContain(kind)
    const given = new Set(scenarioVerdicts().flatMap(v => v.actions.map(a => a.kind)))
    for (const kind of given) expect(known, kind).toContain(kind)
  })

  it('says a water change with its percentage, the engine\'s text in the client\'s units as the why', () => {
    const action = { kind: 'water-change', waterChangePercent: 42.3, message: 'Change 43 % of the water (about 127 L) now to bring total ammonia from 2.2 mg/L as N (about 2.7 ppm as NH3) to about 1 mg/L as N (about 1.2 ppm as NH3). Match the new water\'s temperature and salinity to the tank.' }
    const words = actionForClient(action, usClient)
    expect(words.text).toBe('Change 43 % of the water now, with new salt water at the tank\'s temperature and salinity.')
    expect(words.why).toContain('gal')
    expect(words.why).not.toContain('mg/L as N')
  })

  it('restates a plain action, or one of an unknown kind, with no why', () => {
    const retest = { kind: 'retest', message: 'Test ammonia and nitrite again within a day.' }
    expect(actionForClient(retest, usClient)).toEqual({ text: 'Test ammonia and nitrite again within a day.', why: null })
    expect(actionForClient({ kind: 'something-new', message: 'Do it.' }, usClient)).toEqual({ text: 'Do it.', why: null })
  })

  it('writes no sentence in the aquarist\'s terms', () => {
    for (const [kind, sentence] of Object.entries(CLIENT_ACTION_WORDS)) {
      const text = sentence({ kind, waterChangePercent: 30 })
      expect(text, kind).not.toMatch(AQUARIST_TERMS)
    }
  })
})
