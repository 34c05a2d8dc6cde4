/**
 * What one uploaded file may be (a plan photo or PDF, the photo of a water test): how large,
 * which types, and the words for a refusal. One home for the upload routes (the body limit,
 * the 413 and 415 answers) and the forms that check a file before sending it. Pure data and
 * valibot, safe for the browser and the server.
 *
 * 10 MB is ours (common practice, no published source): a phone's full-size photo is a few MB.
 */
import * as v from 'valibot'

/** Largest accepted uploaded file, bytes. */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024

/** The file types an upload may carry: the content decides (server), the name must agree. */
export const ACCEPTED_FILE_TYPES = {
  'image/jpeg': { label: 'JPEG image', short: 'JPEG', extensions: ['jpg', 'jpeg'] },
  'image/png': { label: 'PNG image', short: 'PNG', extensions: ['png'] },
  'image/webp': { label: 'WebP image', short: 'WebP', extensions: ['webp'] },
  'application/pdf': { label: 'PDF document', short: 'PDF', extensions: ['pdf'] },
} as const
export type AcceptedMimeType = keyof typeof ACCEPTED_FILE_TYPES

/** Every accepted type (the plan's files); a test photo takes the images only. */
export const UPLOAD_TYPES = Object.keys(ACCEPTED_FILE_TYPES) as AcceptedMimeType[]
export const PHOTO_TYPES = UPLOAD_TYPES.filter(type => type.startsWith('image/'))

export const UPLOAD_EMPTY_MESSAGE = 'The file is empty.'
export const UPLOAD_MISSING_MESSAGE = 'Choose a file to upload.'

/** The 413 answer, and what a form says before sending a file that large. */
export function uploadTooLargeMessage(): string {
  return `Files are at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`
}

/** "JPEG, PNG or WebP photos and PDF documents" for the types given. */
export function acceptedTypesWords(types: readonly AcceptedMimeType[] = UPLOAD_TYPES): string {
  const images = types.filter(type => type.startsWith('image/')).map(type => ACCEPTED_FILE_TYPES[type].short)
  const photos = images.length ? `${images.length > 1 ? `${images.slice(0, -1).join(', ')} or ${images.at(-1)}` : images[0]} photos` : ''
  const documents = types.includes('application/pdf') ? 'PDF documents' : ''
  return [photos, documents].filter(Boolean).join(' and ')
}

/** The `accept` attribute of a file input taking these types. */
export function acceptAttribute(types: readonly AcceptedMimeType[] = UPLOAD_TYPES): string {
  return types.join(',')
}

/** The lower-case extension of a file name, or '' when it has none. */
export function extensionOf(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? ''
  const dot = base.lastIndexOf('.')
  return dot > 0 ? base.slice(dot + 1).toLowerCase() : ''
}

/**
 * Whether a chosen file looks like one of the types, by its name's extension (or, without
 * one, the type the browser reports). Only a guess before sending: the server reads the content.
 */
export function looksAccepted(file: { name: string, type?: string }, types: readonly AcceptedMimeType[] = UPLOAD_TYPES): boolean {
  const ext = extensionOf(file.name)
  if (ext) return types.some(type => (ACCEPTED_FILE_TYPES[type].extensions as readonly string[]).includes(ext))
  return types.includes(file.type as AcceptedMimeType)
}

/**
 * The form's schema for one file in the field `file`: chosen, not empty, within the limit, of
 * an accepted type; every problem found in one round.
 */
export function uploadFileSchema(types: readonly AcceptedMimeType[] = UPLOAD_TYPES) {
  return v.object({
    file: v.pipe(
      v.custom<File>(value => typeof File !== 'undefined' && value instanceof File, UPLOAD_MISSING_MESSAGE),
      v.check(file => file.size > 0, UPLOAD_EMPTY_MESSAGE),
      v.check(file => file.size <= MAX_UPLOAD_BYTES, uploadTooLargeMessage()),
      v.check(file => looksAccepted(file, types), `Only ${acceptedTypesWords(types)} can be added here.`),
    ),
  })
}
