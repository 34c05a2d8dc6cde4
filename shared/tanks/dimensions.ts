/**
 * The inside dimensions a tank form sends, checked against its shape, and the gross volume
 * the server stores from them. Pure, so the tank routes and the demo seed compute the same
 * volume and refuse the same dimensions.
 */
import { tankShapeFrom, tankVolume, type TankDimensionsMm } from '../calc/volume'
import { SHAPE_DIMENSIONS } from '../schemas/tanks'
import type { TankShape } from '../vocabulary'

export interface DimensionIssue {
  field: string
  message: string
}

export type TankVolumeResult
  = | { ok: true, dimensions: TankDimensionsMm, volumeLitres: number }
    | { ok: false, issues: DimensionIssue[] }

/** Keeps only the dimensions the shape uses and computes the gross volume in litres (one decimal), or says which dimension is missing or impossible. */
export function tankVolumeFromDimensions(shape: TankShape, dimensions: TankDimensionsMm): TankVolumeResult {
  const kept: TankDimensionsMm = {}
  const issues: DimensionIssue[] = []
  for (const name of SHAPE_DIMENSIONS[shape]) {
    const value = dimensions[name]
    if (value === undefined || !(value > 0)) issues.push({ field: `dimensions.${name}`, message: 'Enter this inside dimension; it must be more than zero.' })
    else kept[name] = value
  }
  if (issues.length) return { ok: false, issues }
  try {
    const volume = tankVolume({ shape: tankShapeFrom(shape, kept) })
    return { ok: true, dimensions: kept, volumeLitres: Math.round(volume.grossL * 10) / 10 }
  }
  catch (error) {
    const message = error instanceof RangeError ? error.message : ''
    const field = /^(\w+Mm)\b/.exec(message)?.[1]
    return {
      ok: false,
      issues: [{ field: field ? `dimensions.${field}` : 'dimensions', message: field === 'bowDepthMm' ? 'The bow can bulge at most half the length.' : 'These dimensions do not describe a tank of this shape.' }],
    }
  }
}
