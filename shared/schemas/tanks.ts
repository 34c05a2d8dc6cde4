import * as v from 'valibot'
import { CYCLE_METHODS, TANK_MATERIALS, TANK_SHAPES, WATER_SOURCES, type TankShape } from '../vocabulary'

/** Which inside dimensions each shape needs, in the order the form asks for them. */
export const SHAPE_DIMENSIONS = {
  'rectangular': ['lengthMm', 'widthMm', 'heightMm'],
  'cube': ['sideMm'],
  'cylinder': ['diameterMm', 'heightMm'],
  'bow-front': ['lengthMm', 'widthMm', 'bowDepthMm', 'heightMm'],
  'corner': ['radiusMm', 'heightMm'],
  'hexagonal': ['sideMm', 'heightMm'],
} as const satisfies Record<TankShape, readonly string[]>

const mm = (label: string) => v.optional(v.pipe(
  v.number(`${label} must be a number.`),
  v.finite(`${label} must be a number.`),
  v.minValue(0, `${label} cannot be negative.`),
  v.maxValue(10_000, `${label} is at most 10 m.`),
))

/** Inside dimensions in millimetres (the form converts from the user's units). */
export const DimensionsSchema = v.strictObject({
  lengthMm: mm('Length'),
  widthMm: mm('Width'),
  heightMm: mm('Height'),
  diameterMm: mm('Diameter'),
  radiusMm: mm('Side length'),
  sideMm: mm('Side'),
  bowDepthMm: mm('Bow depth'),
}, 'Unknown dimension.')

const optionalId = (message: string) => v.optional(v.nullable(v.pipe(v.string(), v.uuid(message))))

const TankFields = {
  name: v.pipe(v.string('Name the tank.'), v.trim(), v.minLength(1, 'Name the tank.'), v.maxLength(120, 'That name is too long.')),
  clientId: v.pipe(v.string('Choose a client.'), v.uuid('Choose a client.')),
  siteId: optionalId('Choose a site.'),
  shape: v.picklist(TANK_SHAPES, 'Choose a shape.'),
  dimensions: DimensionsSchema,
  sumpLitres: v.optional(v.pipe(v.number('Sump volume must be a number.'), v.finite('Sump volume must be a number.'), v.minValue(0, 'Sump volume cannot be negative.'), v.maxValue(20_000, 'Sump volume is at most 20,000 L.')), 0),
  material: v.optional(v.picklist(TANK_MATERIALS, 'Glass or acrylic.'), 'glass'),
  waterSource: v.optional(v.picklist(WATER_SOURCES, 'Natural seawater or mixed salt.'), 'mixed'),
  cycleMethod: v.optional(v.picklist(CYCLE_METHODS, 'Fishless or fish-in.'), 'fishless'),
  aquaristId: optionalId('Choose an aquarist.'),
  supervisorId: optionalId('Choose a supervisor.'),
}

/** POST /api/tanks body and the tank form. The server computes volumeLitres from the dimensions. */
export const TankCreateSchema = v.object(TankFields)
export type TankInput = v.InferOutput<typeof TankCreateSchema>

/** Why a signed-off tank's certificate facts change: required for such a change, shown on the certificate. */
export const AmendmentReasonSchema = v.pipe(v.string('Write why the signed record changes.'), v.trim(), v.minLength(3, 'Write why the signed record changes.'), v.maxLength(500, 'Keep the reason under 500 characters.'))

/** The edit form: every field, as it sends them all, and a reason when the tank is signed off. */
export const TankEditSchema = v.object({ ...TankFields, amendmentReason: v.optional(AmendmentReasonSchema) })
export type TankEditInput = v.InferOutput<typeof TankEditSchema>

/** PATCH /api/tanks/:id body: any field; shape and dimensions travel together. */
export const TankPatchSchema = v.pipe(
  v.partial(v.object({
    ...TankFields,
    sumpLitres: v.pipe(v.number('Sump volume must be a number.'), v.finite('Sump volume must be a number.'), v.minValue(0, 'Sump volume cannot be negative.'), v.maxValue(20_000, 'Sump volume is at most 20,000 L.')),
    material: v.picklist(TANK_MATERIALS, 'Glass or acrylic.'),
    waterSource: v.picklist(WATER_SOURCES, 'Natural seawater or mixed salt.'),
    cycleMethod: v.picklist(CYCLE_METHODS, 'Fishless or fish-in.'),
    /** Required to change what a signed-off tank's certificate prints; the amendment is shown on it. */
    amendmentReason: AmendmentReasonSchema,
  })),
  v.forward(
    v.check(input => (input.shape === undefined) === (input.dimensions === undefined), 'Send the shape and its dimensions together.'),
    ['dimensions'],
  ),
)
export type TankPatch = v.InferOutput<typeof TankPatchSchema>
