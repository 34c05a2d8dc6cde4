import { tankShapeFrom, type TankDimensionsMm, type TankShape, type TankShapeKind } from './volume'

/** The tank's typed shape for the calculators, or null when its stored dimensions are incomplete. */
export function tankShapeOf(tank: { shape: string, dimensions: TankDimensionsMm }): TankShape | null {
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
