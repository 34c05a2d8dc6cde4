import * as v from 'valibot'
import { UNIT_SYSTEMS } from '../vocabulary'

/** Route parameter `:id` — our ids are UUIDs. */
export const IdParams = v.object({
  id: v.pipe(v.string(), v.uuid('Not a valid id.')),
})

/** Body of an archive route: archive (the default) or restore with `{ archived: false }`. */
export const ArchiveSchema = v.object({
  archived: v.optional(v.boolean('archived is true or false.'), true),
})

/** A unit system choice: US (gallons, °F, inches) or metric (litres, °C, millimetres). */
export const UnitSystemSchema = v.picklist(UNIT_SYSTEMS, 'Choose US or metric units.')
