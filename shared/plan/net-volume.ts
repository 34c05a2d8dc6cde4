/**
 * The water a tank actually holds once sand and rock are in, plus its sump: what salt,
 * ammonia doses and water changes are worked out for. Read from the tank's shape and its
 * build plan (the substrate stage's sand depth, the water-fill stage's rock weight).
 */

import { tankShapeOf } from '../calc/tank-shape'
import { tankVolume, type TankDimensionsMm } from '../calc/volume'

/** What the net volume needs to know about a tank. */
export interface NetVolumeTank {
  shape: string
  dimensions: TankDimensionsMm
  volumeLitres: number
  sumpLitres: number
}

/** A plan stage's key and helper values. */
export interface NetVolumeStage {
  key: string
  data: Record<string, unknown>
}

const numberIn = (stages: readonly NetVolumeStage[], key: string, field: string): number => {
  const value = stages.find(s => s.key === key)?.data[field]
  return typeof value === 'number' && Number.isFinite(value) && value > 0 ? value : 0
}

/** Net water and whether it came from the dimensions (false: the recorded volume stood in). */
export interface NetWater {
  litres: number
  fromDimensions: boolean
}

/**
 * Net water volume, litres: the display tank net of sand (at its porosity) and rock, plus
 * the sump. `extra` takes values being typed in place of the plan's saved ones. When the
 * stored dimensions are incomplete, the tank's recorded volume stands in, and says so.
 */
export function netWater(tank: NetVolumeTank, stages: readonly NetVolumeStage[], extra: { sandDepthMm?: number, rockKg?: number } = {}): NetWater {
  const sandDepthMm = extra.sandDepthMm ?? numberIn(stages, 'substrate', 'depthMm')
  const rockKg = extra.rockKg ?? numberIn(stages, 'water-fill', 'rockKg')
  const shape = tankShapeOf(tank)
  if (shape !== null) {
    try {
      return { litres: tankVolume({ shape, sandDepthMm, rockKg }).netL + tank.sumpLitres, fromDimensions: true }
    }
    catch {
      // Non-positive dimensions: as incomplete.
    }
  }
  return { litres: tank.volumeLitres + tank.sumpLitres, fromDimensions: false }
}

/** Net water volume in litres (see `netWater`): what salt, ammonia doses and water changes are worked out for. */
export function netWaterLitres(tank: NetVolumeTank, stages: readonly NetVolumeStage[], extra: { sandDepthMm?: number, rockKg?: number } = {}): number {
  return netWater(tank, stages, extra).litres
}
