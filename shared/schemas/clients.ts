import * as v from 'valibot'

const optionalText = (max: number, tooLong: string) =>
  v.optional(v.nullable(v.pipe(v.string('Enter text.'), v.trim(), v.maxLength(max, tooLong))))

/** POST /api/clients body and the client form. */
export const ClientCreateSchema = v.object({
  name: v.pipe(v.string('Enter the client\'s name.'), v.trim(), v.minLength(1, 'Enter the client\'s name.'), v.maxLength(120, 'That name is too long.')),
  email: v.optional(v.nullable(v.union([
    v.literal(''),
    v.pipe(v.string(), v.trim(), v.toLowerCase(), v.maxLength(254, 'That e-mail address is too long.'), v.email('Enter a valid e-mail address.')),
  ], 'Enter a valid e-mail address.'))),
  phone: optionalText(40, 'That phone number is too long.'),
  notes: optionalText(2000, 'Notes are at most 2000 characters.'),
})
export type ClientInput = v.InferOutput<typeof ClientCreateSchema>

/** PATCH /api/clients/:id body: any of the create fields. */
export const ClientPatchSchema = v.partial(ClientCreateSchema)
export type ClientPatch = v.InferOutput<typeof ClientPatchSchema>

/** Query string of GET /api/clients. */
export const ClientListQuerySchema = v.object({
  q: v.optional(v.pipe(v.string(), v.trim(), v.maxLength(100, 'Search text is too long.'))),
  archived: v.optional(v.picklist(['true', 'false'], 'archived is true or false.'), 'false'),
  sort: v.optional(v.picklist(['name', 'updated', 'tanks'], 'Unknown sort field.'), 'name'),
  dir: v.optional(v.picklist(['asc', 'desc'], 'Sort direction is asc or desc.'), 'asc'),
  page: v.optional(v.pipe(v.string(), v.toNumber('Page must be a number.'), v.integer('Page must be a whole number.'), v.minValue(1, 'Page starts at 1.'), v.maxValue(100000, 'Page is too large.')), '1'),
  pageSize: v.optional(v.pipe(v.string(), v.toNumber('Page size must be a number.'), v.integer('Page size must be a whole number.'), v.minValue(1, 'Page size is at least 1.'), v.maxValue(100, 'Page size is at most 100.')), '25'),
})
export type ClientListQuery = v.InferOutput<typeof ClientListQuerySchema>

/** POST /api/clients/:id/sites body and the site form. */
export const SiteCreateSchema = v.object({
  label: v.pipe(v.string('Name the site.'), v.trim(), v.minLength(1, 'Name the site.'), v.maxLength(120, 'That name is too long.')),
  address: optionalText(300, 'The address is at most 300 characters.'),
  roomNotes: optionalText(2000, 'Room notes are at most 2000 characters.'),
  accessNotes: optionalText(2000, 'Access notes are at most 2000 characters.'),
})
export type SiteInput = v.InferOutput<typeof SiteCreateSchema>

/** PATCH /api/sites/:id body. */
export const SitePatchSchema = v.partial(SiteCreateSchema)
export type SitePatch = v.InferOutput<typeof SitePatchSchema>
