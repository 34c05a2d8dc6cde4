/** A test's three nitrogen values as stored: mg/L as N, null where not measured. */
export interface NitrogenValues {
  ammoniaN: number | null
  nitriteN: number | null
  nitrateN: number | null
}

/**
 * The stored nitrogen values of the tests a verdict or a saved test rests on, unrounded, in one
 * list. The verdict's words quote these values rounded; the kit-unit wording (`inKitUnits`) finds
 * the exact value behind each figure here, so converting to the kit's units does not round twice.
 * Takes the tests as a list or as the verdict's map by id.
 */
export function exactNitrogenOf(tests: readonly NitrogenValues[] | Readonly<Record<string, NitrogenValues>>): (number | null)[] {
  return Object.values(tests).flatMap(t => [t.ammoniaN, t.nitriteN, t.nitrateN])
}
