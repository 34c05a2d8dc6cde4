/** What a file is, judged from its first bytes (magic numbers), never from its name. Framework-free. */

import { ACCEPTED_FILE_TYPES, acceptedTypesWords, extensionOf, type AcceptedMimeType } from '#shared/uploads/files'

// The accepted types and their names live with the upload limit, where the forms read them too.
export { ACCEPTED_FILE_TYPES, extensionOf, type AcceptedMimeType }

const startsWith = (bytes: Uint8Array, signature: readonly number[], offset = 0) =>
  bytes.length >= offset + signature.length && signature.every((b, i) => bytes[offset + i] === b)

/** The accepted type the bytes carry, or null for anything else. */
export function detectFileType(bytes: Uint8Array): AcceptedMimeType | null {
  if (startsWith(bytes, [0xFF, 0xD8, 0xFF])) return 'image/jpeg'
  if (startsWith(bytes, [0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A])) return 'image/png'
  // RIFF <size> WEBP
  if (startsWith(bytes, [0x52, 0x49, 0x46, 0x46]) && startsWith(bytes, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp'
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2D])) return 'application/pdf'
  return null
}

/**
 * Why a file is refused, or null when it is accepted: the content must be an accepted
 * type, and a name that carries an extension must agree with the content.
 */
export function fileTypeProblem(name: string, detected: AcceptedMimeType | null): string | null {
  if (!detected) return `Only ${acceptedTypesWords()} can be uploaded; this file's content is none of those.`
  const ext = extensionOf(name)
  const expected: readonly string[] = ACCEPTED_FILE_TYPES[detected].extensions
  if (ext && !expected.includes(ext)) {
    return `The file is named .${ext} but its content is a ${ACCEPTED_FILE_TYPES[detected].label}. Rename it or upload the file you meant.`
  }
  return null
}
