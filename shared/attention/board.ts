/**
 * The attention board's judgement, pure: what each tank needs today and how urgent it
 * is. The server gathers the facts (alerts, last test, stored verdict, sign-off
 * request); this decides the signals and their order, with `now` as an input so the
 * board changes as time passes without any new data.
 */
import type { Verdict } from '../cycle/types'
import type { AttentionForecast, AttentionItem, AttentionSignal } from '../types/attention'
import type { CyclePhase, TankStatus } from '../types/tanks'
import type { AttentionSort } from '../schemas/attention'
import type { ACTIVE_ALERT_STATUSES } from '../vocabulary'

const HOUR_MS = 3_600_000

export interface BoardAlert {
  message: string
  openedAt: string
  status: (typeof ACTIVE_ALERT_STATUSES)[number]
  acknowledgedByName: string | null
  acknowledgedAt: string | null
  escalatedAt: string | null
}

/** A tank's completion forecast as the board takes it (the server computes it as the tank list does). */
export type BoardForecast = AttentionForecast

/** The facts about one tank the board judges. */
export interface BoardTank {
  tankId: string
  tankName: string
  clientName: string
  siteLabel: string | null
  status: TankStatus
  aquaristId: string | null
  aquaristName: string | null
  cycleStartedAt: string | null
  lastTestAt: string | null
  verdict: Pick<Verdict, 'phase' | 'findings' | 'readiness'> | null
  alerts: BoardAlert[]
  /** When an open sign-off request was made, or null. */
  signOffRequestedAt: string | null
  /** The completion forecast while the tank is cycling or cycled, else null. */
  forecast: BoardForecast | null
}

/** Statuses in which the client is expected to test daily. */
const TESTING_STATUSES: ReadonlySet<TankStatus> = new Set(['cycling', 'cycled'])

/** Weights that order the board: any danger above any missed test, a missed test above paperwork. */
const WEIGHT = { alertOpen: 10_000, alertAcknowledged: 5_000, overdue: 1_000, stalled: 600, signOff: 300, stocking: 100 } as const

/** "14 h", "3 days": an age in hours as short words. */
export function hoursWords(hours: number): string {
  const h = Math.max(0, Math.round(hours))
  return h < 48 ? `${h} h` : `${Math.round(h / 24)} days`
}

function signal(partial: Pick<AttentionSignal, 'kind' | 'severity' | 'title'> & Partial<AttentionSignal>): AttentionSignal {
  return { detail: null, since: null, acknowledgedByName: null, acknowledgedAt: null, ...partial }
}

function alertSignals(tank: BoardTank): { signals: AttentionSignal[], weight: number } {
  let weight = 0
  const signals = tank.alerts.map((a) => {
    weight += a.status === 'open' ? WEIGHT.alertOpen : WEIGHT.alertAcknowledged
    return signal({
      kind: 'alert', severity: 'danger',
      title: a.status === 'open' ? (a.escalatedAt ? 'Danger alert, not acknowledged, escalated' : 'Danger alert, not acknowledged') : 'Danger alert, acknowledged',
      detail: a.message, since: a.openedAt, acknowledgedByName: a.acknowledgedByName, acknowledgedAt: a.acknowledgedAt,
    })
  })
  return { signals, weight }
}

function overdueSignal(tank: BoardTank, nowMs: number, intervalHours: number): { signal: AttentionSignal, weight: number } | null {
  if (!TESTING_STATUSES.has(tank.status)) return null
  const from = tank.lastTestAt ?? tank.cycleStartedAt
  if (!from) return null
  const sinceHours = (nowMs - Date.parse(from)) / HOUR_MS
  const overdueHours = sinceHours - intervalHours
  if (!(overdueHours > 0)) return null
  return {
    signal: signal({
      kind: 'overdue-test', severity: 'caution',
      title: tank.lastTestAt ? `No test for ${hoursWords(sinceHours)}` : `No test since the cycle began, ${hoursWords(sinceHours)} ago`,
      detail: `A test is expected every ${intervalHours} h; this one is ${hoursWords(overdueHours)} overdue.`,
      since: from,
    }),
    // Longer silence is more urgent, up to a week's worth.
    weight: WEIGHT.overdue + Math.min(overdueHours, 168),
  }
}

function stalledSignal(tank: BoardTank): AttentionSignal | null {
  const stall = tank.verdict?.findings.find(f => f.ruleId === 'cycle.stalled')
  return stall ? signal({ kind: 'stalled', severity: 'caution', title: 'Cycle stalled', detail: stall.message }) : null
}

function signOffSignal(tank: BoardTank): AttentionSignal | null {
  if (tank.signOffRequestedAt) {
    return signal({ kind: 'sign-off-requested', severity: 'info', title: 'Waiting for sign-off', detail: 'The aquarist asked a supervisor to review and sign the cycle off.', since: tank.signOffRequestedAt })
  }
  if (tank.status === 'cycling' && tank.verdict?.phase === 'complete') {
    return signal({ kind: 'ready-for-sign-off', severity: 'info', title: 'Cycle complete: ready to ask for sign-off' })
  }
  return null
}

/** The earliest time any livestock group may go in, if it has passed. */
function stockingSince(tank: BoardTank, nowMs: number): string | null {
  if (tank.status !== 'signed-off' || !tank.verdict) return null
  const dates = Object.values(tank.verdict.readiness)
    .filter(r => r.allowed || (r.earliest !== null && Date.parse(r.earliest) <= nowMs))
    .map(r => r.earliest ?? new Date(nowMs).toISOString())
    .sort()
  return dates[0] ?? null
}

/** What one tank needs today, most urgent first, with its urgency. */
export function judgeTank(tank: BoardTank, now: Date, testIntervalHours: number): AttentionItem {
  const nowMs = now.getTime()
  const alerts = alertSignals(tank)
  const signals = [...alerts.signals]
  let urgency = alerts.weight
  const overdue = overdueSignal(tank, nowMs, testIntervalHours)
  if (overdue) {
    signals.push(overdue.signal)
    urgency += overdue.weight
  }
  const stalled = stalledSignal(tank)
  if (stalled) {
    signals.push(stalled)
    urgency += WEIGHT.stalled
  }
  const signOff = signOffSignal(tank)
  if (signOff) {
    signals.push(signOff)
    urgency += WEIGHT.signOff
  }
  const stocking = stockingSince(tank, nowMs)
  if (stocking) {
    signals.push(signal({ kind: 'stocking-due', severity: 'info', title: 'Past the earliest stocking date', detail: 'Signed off and ready for its first livestock: agree the order with the client.', since: stocking }))
    urgency += WEIGHT.stocking
  }
  return {
    tankId: tank.tankId,
    tankName: tank.tankName,
    clientName: tank.clientName,
    siteLabel: tank.siteLabel,
    status: tank.status,
    phase: (tank.verdict?.phase ?? null) as CyclePhase | null,
    aquaristId: tank.aquaristId,
    aquaristName: tank.aquaristName,
    lastTestAt: tank.lastTestAt,
    urgency,
    signals,
    forecast: tank.forecast,
  }
}

type Compare = (a: AttentionItem, b: AttentionItem) => number

const byName: Compare = (a, b) => a.tankName.localeCompare(b.tankName) || a.tankId.localeCompare(b.tankId)

/**
 * When the forecast expects the engine to prove the cycle (epoch ms): its likely day, or the
 * day it was proven once it is (which is past, so a proven cycle sorts before any forecast).
 * Null without a range: not cycling, or "not enough data yet".
 */
export function expectedCompletionMs(item: AttentionItem): number | null {
  const f = item.forecast
  if (!f || f.status === 'not-enough-data' || !f.likely) return null
  return Date.parse(f.likely)
}

const ORDERS: Record<AttentionSort, Compare> = {
  'urgency': (a, b) => b.urgency - a.urgency || byName(a, b),
  'name': byName,
  'last-test': (a, b) => (a.lastTestAt ?? '').localeCompare(b.lastTestAt ?? '') || byName(a, b),
  'completion': (a, b) => {
    const x = expectedCompletionMs(a)
    const y = expectedCompletionMs(b)
    if (x === null || y === null) return Number(x === null) - Number(y === null) || byName(a, b)
    return x - y || byName(a, b)
  },
}

const inDanger = (item: AttentionItem) => item.signals.some(s => s.severity === 'danger')

/**
 * Orders the board: most urgent first, by name, longest without a test first, or soonest
 * expected completion first (tanks without a forecast last). Whatever the order, tanks with
 * a danger alert come first, most urgent first: a chosen order must never bury an animal at risk.
 */
export function sortBoard(items: readonly AttentionItem[], sort: AttentionSort): AttentionItem[] {
  const danger = items.filter(inDanger).sort(ORDERS.urgency)
  const rest = items.filter(i => !inDanger(i)).sort(ORDERS[sort])
  return [...danger, ...rest]
}
