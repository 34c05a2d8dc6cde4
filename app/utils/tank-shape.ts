import { tankShapeFrom, type TankShape, type TankShapeKind } from '#shared/calc/volume'
import type { TankView } from '#shared/types/tanks'

/** The tank's typed shape for the calculators, or null when its stored dimensions are incomplete. */
export function tankShapeOf(tank: Pick<TankView, 'shape' | 'dimensions'>): TankShape | null {
  const dims = tank.dimensions
  try {
    return tankShapeFrom(tank.shape as TankShapeKind, dims)
  }
  catch {
    // Older records describe a cube by its length.
    if (tank.shape === 'cube' && dims.lengthMm) return { kind: 'cube', sideMm: dims.lengthMm }
    return null
  }
}
