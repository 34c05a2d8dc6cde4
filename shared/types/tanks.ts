/** API response shapes for tanks. Values are canonical (litres, mm); the client converts for display. */
import type { PageOf } from './list'
import type { CycleForecast } from '../cycle/forecast/types'
import type { CycleMethod, CyclePhase, TankMaterial, TankShape, TankStatus, WaterSource } from '../vocabulary'

export type { CyclePhase, TankStatus } from '../vocabulary'

export interface TankSummary {
  id: string
  name: string
  status: TankStatus
  cycleMethod: CycleMethod
  volumeLitres: number
  clientId: string
  clientName: string
  siteLabel: string | null
  aquaristName: string | null
  phase: CyclePhase | null
  /** The first stage of the build plan that is neither done nor skipped; null when all are. */
  currentStageKey: string | null
  currentStageTitle: string | null
  stagesDone: number
  stagesTotal: number
  cycleStartedAt: string | null
  updatedAt: string
  /** In lists, for tanks cycling or awaiting sign-off: when the cycle is likely to be proven (never a promise). */
  forecast?: CycleForecast | null
}

export type TankList = PageOf<TankSummary>

export interface TankView extends TankSummary {
  shape: TankShape
  siteId: string | null
  dimensions: Record<string, number | undefined>
  sumpLitres: number
  material: TankMaterial
  waterSource: WaterSource
  aquaristId: string | null
  supervisorId: string | null
  supervisorName: string | null
  kitBasis: { ammonia: string, nitrite: string, nitrate: string }
  /** Water the tank holds with sand, rock and sump (shared/plan/net-volume), litres: what doses are worked out for. */
  netWaterLitres: number
  createdAt: string
}
