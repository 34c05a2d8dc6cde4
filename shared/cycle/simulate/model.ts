/**
 * A small nitrification model: two bacterial populations that grow on what they eat.
 * Ammonia-oxidising bacteria (AOB) turn total ammonia into nitrite, nitrite-oxidising
 * bacteria (NOB) turn nitrite into nitrate, each at a capacity (mg N/L per day) that
 * grows while it has food and slowly dies back without it. Uptake follows a Monod
 * curve; oxidising ammonia consumes alkalinity (7.14 mg CaCO3 per mg N, 1 dKH =
 * 17.848 mg/L CaCO3: reference.md section 10), and low alkalinity slows both steps,
 * which is how a long fishless cycle stalls. Rates are chosen so an unseeded tank
 * with bottled bacteria cycles in three to five weeks, as the trade describes
 * (reference.md section 9; common practice, no published source). Pure and
 * deterministic: no clock, no randomness.
 */

/** mg CaCO3 consumed per mg ammonia-N oxidised (nitrification stoichiometry). */
export const CACO3_PER_MG_N = 7.14
/** mg/L CaCO3 in one dKH. */
export const CACO3_PER_DKH = 17.848

/** Growth and uptake constants. */
export interface ModelRates {
  /** Largest growth rate of AOB and NOB on plenty of food, per day. */
  readonly aobGrowthPerDay: number
  readonly nobGrowthPerDay: number
  /** Die-back per day. */
  readonly decayPerDay: number
  /** Half-saturation concentrations, mg N/L. */
  readonly ammoniaHalfN: number
  readonly nitriteHalfN: number
  /** Capacity never grows past this, mg N/L per day (the surface area of rock and sand). */
  readonly maxCapacityN: number
  /** Below `alkalinityStallDkh` nitrification stops; above `alkalinityFullDkh` it runs at full speed. */
  readonly alkalinityStallDkh: number
  readonly alkalinityFullDkh: number
}

/** Rates of an ordinary reef tank (common practice, no published source). */
export const DEFAULT_RATES: ModelRates = Object.freeze({
  aobGrowthPerDay: 0.4,
  nobGrowthPerDay: 0.3,
  decayPerDay: 0.05,
  ammoniaHalfN: 0.1,
  nitriteHalfN: 0.1,
  maxCapacityN: 40,
  alkalinityStallDkh: 2,
  alkalinityFullDkh: 5,
})

/** The water and the bacteria at one instant. */
export interface TankState {
  /** Total ammonia, mg/L as N. */
  ammoniaN: number
  nitriteN: number
  nitrateN: number
  /** What the AOB and NOB could process today at full food, mg N/L per day. */
  aobCapacityN: number
  nobCapacityN: number
  alkalinityDkh: number
}

/** How much alkalinity lets nitrification run: 0 at the stall point, 1 at full speed. */
export function alkalinityFactor(alkalinityDkh: number, rates: ModelRates = DEFAULT_RATES): number {
  const span = rates.alkalinityFullDkh - rates.alkalinityStallDkh
  return Math.max(0, Math.min(1, (alkalinityDkh - rates.alkalinityStallDkh) / span))
}

/**
 * Advances the state by `hours` with `loadNPerDay` of ammonia arriving steadily
 * (fish and food). Small explicit steps keep the stiff Monod terms stable.
 */
export function advance(state: TankState, hours: number, loadNPerDay: number, rates: ModelRates = DEFAULT_RATES): TankState {
  const s = { ...state }
  const steps = Math.max(1, Math.ceil(hours * 4))
  const dt = hours / 24 / steps
  for (let i = 0; i < steps; i += 1) {
    const alk = alkalinityFactor(s.alkalinityDkh, rates)
    const aobFood = s.ammoniaN / (rates.ammoniaHalfN + s.ammoniaN)
    const nobFood = s.nitriteN / (rates.nitriteHalfN + s.nitriteN)
    const oxidisedA = Math.min(s.ammoniaN + loadNPerDay * dt, s.aobCapacityN * aobFood * alk * dt)
    const oxidisedN = Math.min(s.nitriteN, s.nobCapacityN * nobFood * alk * dt)
    s.ammoniaN = Math.max(0, s.ammoniaN + loadNPerDay * dt - oxidisedA)
    s.nitriteN = Math.max(0, s.nitriteN + oxidisedA - oxidisedN)
    s.nitrateN += oxidisedN
    s.alkalinityDkh = Math.max(0, s.alkalinityDkh - (oxidisedA * CACO3_PER_MG_N) / CACO3_PER_DKH)
    const grow = (capacity: number, rate: number, food: number) =>
      Math.min(rates.maxCapacityN, Math.max(0.001, capacity * (1 + (rate * food * alk - rates.decayPerDay) * dt)))
    s.aobCapacityN = grow(s.aobCapacityN, rates.aobGrowthPerDay, aobFood)
    s.nobCapacityN = grow(s.nobCapacityN, rates.nobGrowthPerDay, nobFood)
  }
  return s
}

/** A water change of `fraction` of the volume with new water holding no nitrogen and `newAlkalinityDkh`. */
export function changeWater(state: TankState, fraction: number, newAlkalinityDkh: number): TankState {
  const keep = 1 - Math.max(0, Math.min(1, fraction))
  return {
    ...state,
    ammoniaN: state.ammoniaN * keep,
    nitriteN: state.nitriteN * keep,
    nitrateN: state.nitrateN * keep,
    alkalinityDkh: state.alkalinityDkh * keep + newAlkalinityDkh * (1 - keep),
  }
}
