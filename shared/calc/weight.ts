/**
 * Filled weight of a tank and its footprint load, compared with the uniform design live
 * load of the room's occupancy (International Residential Code Table R301.5 for homes,
 * International Building Code Table 1607.1 for offices and shops). The comparison is
 * information for the site survey, never a structural verdict.
 */

import { seawaterDensity } from '../chemistry/seawater'
import { STANDARD_GRAVITY, assertFinite, assertPositive, knPerM2ToPsf } from '../units'
import { sandBulkDensity } from './substrate'
import { shapeGeometry, tankVolume, type VolumeInput } from './volume'

const IBC = 'IBC Table 1607.1 (from memory: confirm against the edition in force)'

/**
 * Uniformly distributed design live loads by occupancy, psf. Residential: IRC Table R301.5
 * (sleeping rooms 30, other rooms 40). Offices 50, retail 75 on upper floors and 100 on the
 * first floor: IBC Table 1607.1, from memory.
 */
export const DESIGN_LIVE_LOADS = {
  'sleeping-room': { psf: 30, label: 'Home, sleeping room', code: 'IRC Table R301.5' },
  'living-area': { psf: 40, label: 'Home, other rooms', code: 'IRC Table R301.5' },
  'office': { psf: 50, label: 'Office', code: IBC },
  'retail-upper': { psf: 75, label: 'Shop, upper floor', code: IBC },
  'retail-first': { psf: 100, label: 'Shop, first floor', code: IBC },
} as const
export type RoomUse = keyof typeof DESIGN_LIVE_LOADS
/** The occupancies, lightest design load first. */
export const ROOM_USES = Object.keys(DESIGN_LIVE_LOADS) as RoomUse[]

/** Shell materials, density g/cm3: soda-lime glass and cast acrylic (from memory). */
export const SHELL_DENSITY_G_CM3 = { glass: 2.5, acrylic: 1.19 } as const
export type ShellMaterial = keyof typeof SHELL_DENSITY_G_CM3

/** Shown with every footprint-load comparison. */
export const LOAD_CAUTION
  = 'This compares the average load under the footprint with the code\'s uniform design live load for the room\'s use. '
    + 'It is not a structural assessment: joist span and direction, point loads under the stand, other furniture and '
    + 'the condition of the floor all matter. Have a licensed structural engineer check the floor against local codes.'

/** A tank, its contents and the room it stands in. */
export interface WeightInput extends VolumeInput {
  salinity: number
  temperatureC: number
  shellMaterial: ShellMaterial
  /** Panel thickness, mm; the shell is estimated as bottom plus walls of this thickness. */
  shellThicknessMm: number
  /** Dry bulk density of the sand bed, g/cm3 (sand mass = bed volume x this). */
  sandBulkDensityGCm3?: number
  /** Stand, sump, equipment and anything else on the footprint, kg. */
  otherKg?: number
  /** Area the load spreads over (usually the stand's), m^2; defaults to the tank's footprint. */
  bearingAreaM2?: number
  roomUse?: RoomUse
}

/** Weight breakdown and footprint load compared with the code's live load. */
export interface WeightResult {
  waterKg: number
  shellKg: number
  sandKg: number
  rockKg: number
  otherKg: number
  totalKg: number
  bearingAreaM2: number
  loadKnPerM2: number
  loadPsf: number
  designLiveLoadPsf: number
  /** Footprint load over design live load; above 1 means the footprint load is higher than the code's figure. */
  ratioToDesignLiveLoad: number
  exceedsDesignLiveLoad: boolean
  caution: string
}

/** Filled weight and footprint load of a tank, with the comparison's caution. */
export function filledWeight(input: WeightInput): WeightResult {
  const geometry = shapeGeometry(input.shape)
  const volume = tankVolume(input)
  assertPositive('shellThicknessMm', input.shellThicknessMm)
  const sandBulk = input.sandBulkDensityGCm3 ?? sandBulkDensity()
  assertFinite('sandBulkDensityGCm3', sandBulk, { min: 0.5, max: 3 })
  const otherKg = input.otherKg ?? 0
  assertFinite('otherKg', otherKg, { min: 0 })
  const bearingAreaM2 = input.bearingAreaM2 ?? volume.footprintM2
  assertPositive('bearingAreaM2', bearingAreaM2)

  const waterKg = (volume.netL * seawaterDensity(input.salinity, input.temperatureC)) / 1000
  // mm^3 x g/cm3 = mg; 1e6 mg per kg
  const shellAreaMm2 = geometry.footprintMm2 + geometry.perimeterMm * geometry.heightMm
  const shellKg = (shellAreaMm2 * input.shellThicknessMm * SHELL_DENSITY_G_CM3[input.shellMaterial]) / 1e6
  const sandKg = (geometry.footprintMm2 * (input.sandDepthMm ?? 0) * sandBulk) / 1e6
  const rockKg = input.rockKg ?? 0
  const totalKg = waterKg + shellKg + sandKg + rockKg + otherKg

  const loadKnPerM2 = (totalKg * STANDARD_GRAVITY) / bearingAreaM2 / 1000
  const loadPsf = knPerM2ToPsf(loadKnPerM2)
  const designLiveLoadPsf = DESIGN_LIVE_LOADS[input.roomUse ?? 'living-area'].psf
  const ratio = loadPsf / designLiveLoadPsf
  return {
    waterKg, shellKg, sandKg, rockKg, otherKg, totalKg,
    bearingAreaM2, loadKnPerM2, loadPsf, designLiveLoadPsf,
    ratioToDesignLiveLoad: ratio,
    exceedsDesignLiveLoad: ratio > 1,
    caution: LOAD_CAUTION,
  }
}
