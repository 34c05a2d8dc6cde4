/**
 * Substrate amount for a target sand-bed depth, as volume, mass and whole bags.
 */

import { CM_PER_INCH, assertFinite, assertInRange, assertPositive } from '../units'
import { ARAGONITE_DENSITY_G_CM3, DEFAULT_SAND_POROSITY, shapeGeometry, type TankShape } from './volume'

/** Sand bed depth, cm: 1-2 in (common practice, no published source). */
export const SAND_BED_DEPTH_RANGE_CM = [1 * CM_PER_INCH, 2 * CM_PER_INCH] as const

/** Dry bulk density of a sand bed, g/cm3, from its mineral density and pore fraction. */
export function sandBulkDensity(mineralDensityGCm3 = ARAGONITE_DENSITY_G_CM3, porosity = DEFAULT_SAND_POROSITY): number {
  assertInRange('mineralDensityGCm3', mineralDensityGCm3, 1, 5)
  assertInRange('porosity', porosity, 0, 0.9)
  return mineralDensityGCm3 * (1 - porosity)
}

/** A sand bed to plan. Give either a tank shape or a footprint area. */
export interface SubstrateInput {
  shape?: TankShape
  footprintCm2?: number
  depthCm: number
  /** Dry bulk density, g/cm3; defaults to aragonite at 45 % porosity (about 1.61). */
  bulkDensityGCm3?: number
  /** Mass of sand per bag, kg. */
  bagKg: number
}

/** Sand needed for the bed. */
export interface SubstrateResult {
  footprintCm2: number
  volumeL: number
  massKg: number
  /** Whole bags to buy. */
  bags: number
  /** Bed depth the whole bags would give, cm. */
  depthWithBagsCm: number
}

/** Volume, mass and bags of sand for a bed of `depthCm` over the tank's footprint. */
export function substrateAmount(input: SubstrateInput): SubstrateResult {
  const footprintCm2 = input.shape ? shapeGeometry(input.shape).footprintCm2 : input.footprintCm2
  if (footprintCm2 === undefined) throw new RangeError('shape or footprintCm2 is required')
  assertPositive('footprintCm2', footprintCm2)
  assertFinite('depthCm', input.depthCm, { min: 0 })
  assertPositive('bagKg', input.bagKg)
  const bulk = input.bulkDensityGCm3 ?? sandBulkDensity()
  assertInRange('bulkDensityGCm3', bulk, 0.5, 3)

  const volumeL = (footprintCm2 * input.depthCm) / 1000
  const massKg = volumeL * bulk
  // Float noise must not buy an extra bag when the mass is an exact multiple.
  const bags = Math.ceil(massKg / input.bagKg - 1e-9)
  const depthWithBagsCm = ((bags * input.bagKg) / bulk) * 1000 / footprintCm2
  return { footprintCm2, volumeL, massKg, bags, depthWithBagsCm }
}
