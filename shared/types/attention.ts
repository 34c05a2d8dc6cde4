/** API response shapes of the attention board (GET /api/attention). */
import type { ListOf } from './list'
import type { CycleForecast } from '../cycle/forecast/types'
import type { CyclePhase, TankStatus } from './tanks'

/** The part of a tank's completion forecast the board sorts by and shows: a forecast, never a promise. */
export type AttentionForecast = Pick<CycleForecast, 'status' | 'gap' | 'completion' | 'likely'>

/** What a tank needs: an open alert, a missed test, a stalled cycle, a sign-off, stocking that may begin. */
export type AttentionKind = 'alert' | 'overdue-test' | 'stalled' | 'sign-off-requested' | 'ready-for-sign-off' | 'stocking-due'

export interface AttentionSignal {
  kind: AttentionKind
  severity: 'danger' | 'caution' | 'info'
  /** Short words for the board, e.g. "No test for 3 days". */
  title: string
  /** One sentence more, or null. */
  detail: string | null
  /** When the matter began (alert opened, last test, request made), ISO; null when it has no start. */
  since: string | null
  /** For alerts: who acknowledged it and when; null while nobody has. */
  acknowledgedByName: string | null
  acknowledgedAt: string | null
}

export interface AttentionItem {
  tankId: string
  tankName: string
  clientName: string
  siteLabel: string | null
  status: TankStatus
  phase: CyclePhase | null
  aquaristId: string | null
  aquaristName: string | null
  lastTestAt: string | null
  /** Higher is more urgent; 0 when nothing is due. */
  urgency: number
  /** Most urgent first. */
  signals: AttentionSignal[]
  /** When the cycle is likely to be proven, while the tank is cycling or cycled; null otherwise. */
  forecast: AttentionForecast | null
}

export interface AttentionBoard extends ListOf<AttentionItem> {
  /** The staff who own a visible tank, for the aquarist filter. */
  aquarists: { id: string, name: string }[]
  /** The time the board was worked out for, ISO. */
  now: string
}
