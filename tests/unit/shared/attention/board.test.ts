import { describe, expect, it } from 'vitest'
import { expectedCompletionMs, hoursWords, judgeTank, sortBoard, type BoardForecast, type BoardTank } from '../../../../shared/attention/board'
import { LIVESTOCK_GROUPS, type GroupReadiness, type LivestockGroup } from '../../../../shared/cycle/types'

const NOW = new Date('2026-03-10T12:00:00Z')
const hoursAgo = (h: number) => new Date(NOW.getTime() - h * 3_600_000).toISOString()
const closed: GroupReadiness = { allowed: false, earliest: null, blockers: ['Not yet'] }
const readiness = (over: Partial<Record<LivestockGroup, GroupReadiness>> = {}) =>
  Object.fromEntries(LIVESTOCK_GROUPS.map(g => [g, over[g] ?? closed])) as Record<LivestockGroup, GroupReadiness>

function tank(over: Partial<BoardTank> = {}): BoardTank {
  return {
    tankId: over.tankName ?? 'a', tankName: 'Reef', clientName: 'Client', siteLabel: null, status: 'cycling',
    aquaristId: null, aquaristName: null, cycleStartedAt: hoursAgo(240), lastTestAt: hoursAgo(2),
    verdict: { phase: 'nitrite', findings: [], readiness: readiness() }, alerts: [], signOffRequestedAt: null, forecast: null, ...over,
  }
}

const DAY_MS = 86_400_000
const daysAhead = (d: number) => new Date(NOW.getTime() + d * DAY_MS).toISOString()
/** A forecast range around its likely day, as the board receives it. */
const expecting = (likelyDays: number): BoardForecast => ({
  status: 'forecast', gap: null, likely: daysAhead(likelyDays), completion: { from: daysAhead(likelyDays - 2), to: daysAhead(likelyDays + 3) },
})
const notEnough: BoardForecast = { status: 'not-enough-data', gap: 'sparse', likely: null, completion: null }
const alertOn = (status: 'open' | 'acknowledged') => ({ message: 'Total ammonia is high', openedAt: hoursAgo(1), status, acknowledgedByName: null, acknowledgedAt: null, escalatedAt: null })

describe('judgeTank', () => {
  it('a quiet cycling tank tested two hours ago needs nothing', () => {
    expect(judgeTank(tank(), NOW, 36)).toMatchObject({ urgency: 0, signals: [] })
  })

  it('a test older than the interval is overdue, with how long in words', () => {
    const item = judgeTank(tank({ lastTestAt: hoursAgo(80) }), NOW, 36)
    expect(item.signals).toHaveLength(1)
    expect(item.signals[0]).toMatchObject({ kind: 'overdue-test', severity: 'caution', title: 'No test for 3 days' })
    expect(item.signals[0]!.detail).toBe('A test is expected every 36 h; this one is 44 h overdue.')
  })

  it('no tests are expected before the tank is filled or after it is signed off', () => {
    for (const status of ['planned', 'building', 'signed-off', 'stocking'] as const) {
      expect(judgeTank(tank({ status, lastTestAt: null, cycleStartedAt: hoursAgo(500) }), NOW, 36).signals.some(s => s.kind === 'overdue-test')).toBe(false)
    }
  })

  it('any open danger alert outranks a week of silence; acknowledged alerts name who and still outrank it', () => {
    const alert = { message: 'Total ammonia is high', openedAt: hoursAgo(1), status: 'open' as const, acknowledgedByName: null, acknowledgedAt: null, escalatedAt: null }
    const silent = judgeTank(tank({ tankName: 'Silent', lastTestAt: hoursAgo(24 * 7) }), NOW, 36)
    const open = judgeTank(tank({ tankName: 'Open', alerts: [alert] }), NOW, 36)
    const acked = judgeTank(tank({ tankName: 'Acked', alerts: [{ ...alert, status: 'acknowledged', acknowledgedByName: 'Wren', acknowledgedAt: hoursAgo(0.5) }] }), NOW, 36)
    expect(open.signals[0]).toMatchObject({ kind: 'alert', title: 'Danger alert, not acknowledged' })
    expect(acked.signals[0]).toMatchObject({ title: 'Danger alert, acknowledged', acknowledgedByName: 'Wren' })
    expect(sortBoard([silent, acked, open], 'urgency').map(i => i.tankName)).toEqual(['Open', 'Acked', 'Silent'])
  })

  it('a stall, a waiting sign-off and a complete cycle without a request each show', () => {
    const stalled = judgeTank(tank({ verdict: { phase: 'nitrite', readiness: readiness(), findings: [{ ruleId: 'cycle.stalled', severity: 'caution', message: 'Nitrite flat for 14 days', readingIds: [] }] } }), NOW, 36)
    expect(stalled.signals.map(s => s.kind)).toEqual(['stalled'])
    const waiting = judgeTank(tank({ status: 'cycled', signOffRequestedAt: hoursAgo(5) }), NOW, 36)
    expect(waiting.signals.map(s => s.kind)).toEqual(['sign-off-requested'])
    const ready = judgeTank(tank({ verdict: { phase: 'complete', findings: [], readiness: readiness() } }), NOW, 36)
    expect(ready.signals.map(s => s.kind)).toEqual(['ready-for-sign-off'])
  })

  it('a signed-off tank past the earliest date of a group is due for stocking from that date', () => {
    const item = judgeTank(tank({ status: 'signed-off', verdict: { phase: 'complete', findings: [], readiness: readiness({ 'fish': { allowed: false, earliest: hoursAgo(30), blockers: [] }, 'sps-coral': { allowed: false, earliest: hoursAgo(-200), blockers: [] } }) } }), NOW, 36)
    expect(item.signals[0]).toMatchObject({ kind: 'stocking-due', since: hoursAgo(30) })
    const notYet = judgeTank(tank({ status: 'signed-off', verdict: { phase: 'complete', findings: [], readiness: readiness({ fish: { allowed: false, earliest: hoursAgo(-5), blockers: [] } }) } }), NOW, 36)
    expect(notYet.signals).toEqual([])
  })
})

describe('sortBoard', () => {
  const a = judgeTank(tank({ tankName: 'Bravo', lastTestAt: hoursAgo(10) }), NOW, 36)
  const b = judgeTank(tank({ tankName: 'Alpha', lastTestAt: hoursAgo(40) }), NOW, 36)
  it('sorts by name and by the oldest last test', () => {
    expect(sortBoard([a, b], 'name').map(i => i.tankName)).toEqual(['Alpha', 'Bravo'])
    expect(sortBoard([a, b], 'last-test').map(i => i.tankName)).toEqual(['Alpha', 'Bravo'])
    expect(sortBoard([b, a], 'urgency').map(i => i.tankName)).toEqual(['Alpha', 'Bravo'])
  })
  it('says hours under two days and days after', () => {
    expect([hoursWords(5), hoursWords(47.4), hoursWords(50)]).toEqual(['5 h', '47 h', '2 days'])
  })
})

describe('sortBoard by expected completion', () => {
  const item = (tankName: string, over: Partial<BoardTank> = {}) => judgeTank(tank({ tankName, ...over }), NOW, 36)
  const names = (items: readonly { tankName: string }[]) => items.map(i => i.tankName)

  it('puts the soonest likely completion first, a cycle already proven before any forecast, and tanks without a forecast last by name', () => {
    const items = [
      item('Late', { forecast: expecting(20) }),
      item('Zulu unknown', { forecast: notEnough }),
      item('Soon', { forecast: expecting(4) }),
      item('Alpha planned', { status: 'planned', forecast: null }),
      item('Proven', { status: 'cycled', forecast: { status: 'complete', gap: null, likely: hoursAgo(30), completion: { from: hoursAgo(30), to: hoursAgo(30) } } }),
      item('Middle', { forecast: expecting(9) }),
    ]
    expect(names(sortBoard(items, 'completion'))).toEqual(['Proven', 'Soon', 'Middle', 'Late', 'Alpha planned', 'Zulu unknown'])
    // The order does not depend on the order the server listed the tanks in.
    expect(names(sortBoard([...items].reverse(), 'completion'))).toEqual(names(sortBoard(items, 'completion')))
  })

  it('breaks a tie on the same likely day by name', () => {
    const items = [item('Bravo', { forecast: expecting(5) }), item('Alpha', { forecast: expecting(5) })]
    expect(names(sortBoard(items, 'completion'))).toEqual(['Alpha', 'Bravo'])
  })

  it('reads the likely day as the sort key, and none without a range', () => {
    expect(expectedCompletionMs(item('A', { forecast: expecting(3) }))).toBe(Date.parse(daysAhead(3)))
    expect(expectedCompletionMs(item('B', { forecast: notEnough }))).toBeNull()
    expect(expectedCompletionMs(item('C'))).toBeNull()
  })

  it('keeps the forecast on the item for the board to show', () => {
    expect(item('A', { forecast: expecting(3) }).forecast).toEqual(expecting(3))
    expect(item('B').forecast).toBeNull()
  })
})

describe('danger stays at the top whatever the order', () => {
  const item = (tankName: string, over: Partial<BoardTank> = {}) => judgeTank(tank({ tankName, ...over }), NOW, 36)
  const items = [
    item('Alpha soon', { forecast: expecting(2), lastTestAt: hoursAgo(20) }),
    item('Yankee acknowledged', { forecast: expecting(30), alerts: [alertOn('acknowledged')], lastTestAt: hoursAgo(1) }),
    item('Bravo untested', { forecast: notEnough, lastTestAt: hoursAgo(70) }),
    item('Zulu open', { forecast: null, alerts: [alertOn('open')], lastTestAt: hoursAgo(1) }),
  ]

  it.each(['urgency', 'name', 'last-test', 'completion'] as const)('%s: tanks with a danger alert first, open before acknowledged', (sort) => {
    expect(names(sortBoard(items, sort)).slice(0, 2)).toEqual(['Zulu open', 'Yankee acknowledged'])
  })

  it('orders the rest as asked', () => {
    expect(names(sortBoard(items, 'completion')).slice(2)).toEqual(['Alpha soon', 'Bravo untested'])
    expect(names(sortBoard(items, 'last-test')).slice(2)).toEqual(['Bravo untested', 'Alpha soon'])
    expect(names(sortBoard(items, 'name')).slice(2)).toEqual(['Alpha soon', 'Bravo untested'])
  })

  function names(list: readonly { tankName: string }[]) {
    return list.map(i => i.tankName)
  }
})
