import * as v from 'valibot'
import { SG_BASIS_KEYS } from '../readings/entry'
import { SALINITY_MODES } from '../vocabulary'

/**
 * PUT /api/tanks/:id/salinity-instrument body, and what the browser's own copy must look like:
 * how a person measures a tank's salinity (the mode and, for a hydrometer or refractometer,
 * the scale printed on it).
 */
export const SalinityInstrumentSchema = v.object({
  mode: v.picklist(SALINITY_MODES, 'Choose how salinity is measured.'),
  sgBasis: v.picklist(SG_BASIS_KEYS, 'Choose the scale printed on the instrument.'),
})
export type SalinityInstrument = v.InferOutput<typeof SalinityInstrumentSchema>
