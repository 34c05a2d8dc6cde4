/**
 * Substrate amount for a target sand-bed depth, as volume, mass and whole bags.
 */

import { MM_PER_INCH, assertFinite, assertInRange, assertPositive } from '../units'
import { ARAGONITE_DENSITY_G_CM3, DEFAULT_SAND_POROSITY, shapeGeometry, type TankShape } from './volume'

/** Sand bed depth, mm: 1-2 in (common practice, no published source). */
export const SAND_BED_DEPTH_RANGE_MM = [1 * MM_PER_INCH, 2 * MM_PER_INCH] as const

/** Dry bulk density of a sand bed, g/cm3, from its mineral density and pore fraction. */
export function sandBulkDensity(mineralDensityGCm3 = ARAGONITE_DENSITY_G_CM3, porosity = DEFAULT_SAND_POROSITY): number {
  assertInRange('mineralDensityGCm3', mineralDensityGCm3, 1, 5)
  assertInRange('porosity', porosity, 0, 0.9)
  return mineralDensityGCm3 * (1 - porosity)
}

/** A sand bed to plan. Give either a tank shape or a footprint area. */
export interface SubstrateInput {
  shape?: TankShape
  footprintM2?: number
  depthMm: number
  /** Dry bulk density, g/cm3; defaults to aragonite at 45 % porosity (about 1.61). */
  bulkDensityGCm3?: number
  /** Mass of sand per bag, kg. */
  bagKg: number
}

/** Sand needed for the bed. */
export interface SubstrateResult {
  footprintM2: number
  volumeL: number
  massKg: number
  /** Whole bags to buy. */
  bags: number
  /** Bed depth the whole bags would give, mm. */
  depthWithBagsMm: number
}

/** Volume, mass and bags of sand for a bed of `depthMm` over the tank's footprint. */
export function substrateAmount(input: SubstrateInput): SubstrateResult {
  const footprintM2 = input.shape ? shapeGeometry(input.shape).footprintMm2 / 1e6 : input.footprintM2
  if (footprintM2 === undefined) throw new RangeError('shape or footprintM2 is required')
  assertPositive('footprintM2', footprintM2)
  assertFinite('depthMm', input.depthMm, { min: 0 })
  assertPositive('bagKg', input.bagKg)
  const bulk = input.bulkDensityGCm3 ?? sandBulkDensity()
  assertInRange('bulkDensityGCm3', bulk, 0.5, 3)

  // m^2 x mm = litres
  const volumeL = footprintM2 * input.depthMm
  const massKg = volumeL * bulk
  // Float noise must not buy an extra bag when the mass is an exact multiple.
  const bags = Math.ceil(massKg / input.bagKg - 1e-9)
  const depthWithBagsMm = (bags * input.bagKg) / bulk / footprintM2
  return { footprintM2, volumeL, massKg, bags, depthWithBagsMm }
}
