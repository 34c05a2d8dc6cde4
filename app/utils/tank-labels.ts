import type { CyclePhase, TankStatus } from '#shared/types/tanks'

/** Plain words for a tank's place in its commissioning. */
export const STATUS_LABELS: Record<TankStatus, string> = {
  'planned': 'Planned',
  'building': 'Being built',
  'cycling': 'Cycling',
  'cycled': 'Cycled, awaiting sign-off',
  'signed-off': 'Signed off',
  'stocking': 'Stocking',
}

/** Plain words for the rule engine's phase. */
export const PHASE_LABELS: Record<CyclePhase, string> = {
  'not-started': 'Cycle not started',
  'ammonia': 'Ammonia stage',
  'nitrite': 'Nitrite stage',
  'settling': 'Settling',
  'complete': 'Cycle complete',
}
