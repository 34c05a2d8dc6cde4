/**
 * The site survey's floor-load comparison for a tank, from its profile and what its build
 * plan records: panel thickness, stand and equipment, occupancy (site survey), sand depth
 * (substrate) and rock (water and fill). One function for the survey helper on screen and
 * the server's check when the survey is closed.
 */
import { tankShapeOf } from '../calc/tank-shape'
import type { TankDimensionsMm } from '../calc/volume'
import { filledWeight, type RoomUse, type WeightResult } from '../calc/weight'
import type { TankMaterial } from '../vocabulary'

/** Salinity and temperature the weight is estimated at: a reef tank's usual target. */
const TARGET_SALINITY = 35
const TARGET_TEMPERATURE_C = 25
/** Sump water weighs about as much as the same volume of seawater, kg per litre. */
const SUMP_KG_PER_L = 1.023
const DEFAULT_PANEL_MM = 10

export interface SurveyLoadTank {
  shape: string
  dimensions: TankDimensionsMm
  material: TankMaterial
  sumpLitres: number
}

export interface SurveyLoadStage {
  key: string
  data: Record<string, unknown>
}

const num = (value: unknown): number | undefined => (typeof value === 'number' && Number.isFinite(value) ? value : undefined)

/** What the plan records that adds weight: sand depth, mm, and rock, kg. */
export function plannedContents(stages: readonly SurveyLoadStage[]): { sandDepthMm: number, rockKg: number } {
  const dataOf = (key: string) => stages.find(s => s.key === key)?.data ?? {}
  return { sandDepthMm: num(dataOf('substrate').depthMm) ?? 0, rockKg: num(dataOf('water-fill').rockKg) ?? 0 }
}

/**
 * Filled weight (water, shell, sand, rock, sump, stand and equipment) and footprint load
 * against the occupancy's design live load; null when the tank's dimensions are incomplete.
 * `survey` overrides the survey stage's stored values (the form being edited).
 */
export function surveyLoad(tank: SurveyLoadTank, stages: readonly SurveyLoadStage[], survey?: Record<string, unknown>): WeightResult | null {
  const shape = tankShapeOf(tank)
  if (!shape) return null
  const values = survey ?? stages.find(s => s.key === 'site-survey')?.data ?? {}
  const { sandDepthMm, rockKg } = plannedContents(stages)
  try {
    return filledWeight({
      shape, salinity: TARGET_SALINITY, temperatureC: TARGET_TEMPERATURE_C, shellMaterial: tank.material,
      shellThicknessMm: num(values.shellThicknessMm) || DEFAULT_PANEL_MM,
      sandDepthMm, rockKg,
      otherKg: (num(values.otherKg) ?? 0) + tank.sumpLitres * SUMP_KG_PER_L,
      roomUse: (values.roomUse as RoomUse | undefined) ?? 'living-area',
    })
  }
  catch {
    return null
  }
}
