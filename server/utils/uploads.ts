/**
 * Receiving, storing and serving files (stage photos now, reading photos later).
 * Bytes live in Nitro storage (`useStorage('uploads')`, see nuxt.config and
 * server/plugins/02.uploads-storage.ts), never at a public path; rows in `uploads`.
 */
import type { H3Event } from 'h3'
import sharp from 'sharp'
import { uploads } from '#server/db/schema'
import type { Db } from '#server/db/connection'
import type { Actor } from './access'
import { detectFileType, fileTypeProblem, type AcceptedMimeType } from './file-type'
import { MAX_UPLOAD_BYTES, UPLOAD_EMPTY_MESSAGE, UPLOAD_MISSING_MESSAGE, uploadTooLargeMessage } from '#shared/uploads/files'
import { removeExpiredPendingPhotos as removeExpiredPendingPhotoRows } from '#server/domain/uploads/pending-photos'

/** Longest side of a thumbnail, px. */
export const THUMBNAIL_SIZE_PX = 480

export interface ReceivedFile {
  bytes: Buffer
  name: string
  mimeType: AcceptedMimeType
  /** The other (text) fields of the form. */
  fields: Record<string, string>
}

function tooLarge(): never {
  throw createError({ statusCode: 413, statusMessage: 'File too large', data: { issues: [{ field: 'file', message: uploadTooLargeMessage() }] } })
}

function refused(statusCode: 400 | 415, message: string): never {
  throw createError({ statusCode, statusMessage: statusCode === 415 ? 'Unsupported file' : 'Validation Error', data: { issues: [{ field: 'file', message }] } })
}

/**
 * Receives one file from a multipart form (field `file`): 413 past the size limit,
 * 415 when the content is not an accepted type or the name's extension lies about it.
 */
export async function receiveUpload(event: H3Event): Promise<ReceivedFile> {
  const contentType = getRequestHeader(event, 'content-type') ?? ''
  if (!contentType.startsWith('multipart/form-data')) refused(400, 'Send the file as multipart/form-data in the field "file".')
  // The body was read and held to the upload limit by server/middleware/00.body-limit.ts.
  const parts = await readMultipartFormData(event)
  const filePart = parts?.find(p => p.name === 'file' && p.filename !== undefined)
  if (!filePart) refused(400, UPLOAD_MISSING_MESSAGE)
  if (filePart.data.length === 0) refused(400, UPLOAD_EMPTY_MESSAGE)
  if (filePart.data.length > MAX_UPLOAD_BYTES) tooLarge()
  const detected = detectFileType(filePart.data)
  const problem = fileTypeProblem(filePart.filename ?? '', detected)
  if (problem || !detected) refused(415, problem ?? 'Unsupported file.')
  const fields: Record<string, string> = {}
  for (const part of parts ?? []) {
    if (part.filename === undefined && part.name) fields[part.name] = part.data.toString('utf8').slice(0, 2000)
  }
  // Control characters and path separators never reach a stored name.
  // eslint-disable-next-line no-control-regex
  const name = (filePart.filename ?? 'file').replace(/[\u0000-\u001F\\/]/g, '_').slice(-120) || 'file'
  return { bytes: filePart.data, name, mimeType: detected, fields }
}

/** A small WebP preview of an image, or 415 when the bytes do not decode as the image they claim to be. */
async function thumbnailOf(bytes: Buffer): Promise<Buffer> {
  try {
    return await sharp(bytes, { limitInputPixels: 100_000_000 })
      .rotate()
      .resize(THUMBNAIL_SIZE_PX, THUMBNAIL_SIZE_PX, { fit: 'inside', withoutEnlargement: true })
      .webp({ quality: 75 })
      .toBuffer()
  }
  catch {
    refused(415, 'The image could not be read. It may be damaged; try saving it again.')
  }
}

/** Where an upload is attached. */
export interface UploadTarget {
  tankId: string
  stageId?: string | null
  readingId?: string | null
}

/**
 * Stores the bytes (and an image's thumbnail), records the row and audits it. Returns the row.
 * `admit` runs inside the write transaction (IMMEDIATE, so no other writer slips in between),
 * just before the row is inserted: a quota checked there holds for uploads that arrive
 * together. When it throws, the stored bytes are removed and nothing is recorded.
 */
export async function storeUpload(actor: Actor, target: UploadTarget, file: ReceivedFile, admit?: (db: Db) => void) {
  const id = crypto.randomUUID()
  const storageKey = `${actor.organisationId}:${target.tankId}:${id}`
  const thumbnail = file.mimeType.startsWith('image/') ? await thumbnailOf(file.bytes) : null
  const storage = useStorage('uploads')
  await storage.setItemRaw(storageKey, file.bytes)
  const thumbnailKey = thumbnail ? `${storageKey}.thumb` : null
  if (thumbnail && thumbnailKey) await storage.setItemRaw(thumbnailKey, thumbnail)
  // The row and its audit line commit together.
  try {
    return await insertUploadRow(actor, target, file, { id, storageKey, thumbnailKey }, admit)
  }
  catch (error) {
    await storage.removeItem(storageKey)
    if (thumbnailKey) await storage.removeItem(thumbnailKey)
    throw error
  }
}

function insertUploadRow(actor: Actor, target: UploadTarget, file: ReceivedFile, keys: { id: string, storageKey: string, thumbnailKey: string | null }, admit?: (db: Db) => void) {
  const { id, storageKey, thumbnailKey } = keys
  return writeTransaction((tx) => {
    admit?.(tx)
    const row = tx.insert(uploads).values({
      id,
      organisationId: actor.organisationId,
      tankId: target.tankId,
      stageId: target.stageId ?? null,
      readingId: target.readingId ?? null,
      mimeType: file.mimeType,
      sizeBytes: file.bytes.length,
      originalName: file.name,
      storageKey,
      thumbnailKey,
      uploadedBy: actor.id,
    }).returning().get()
    writeAudit(actor, { action: 'upload.create', entity: 'upload', entityId: row.id, after: { tankId: row.tankId, stageId: row.stageId, readingId: row.readingId, mimeType: row.mimeType, sizeBytes: row.sizeBytes, originalName: row.originalName } })
    return row
  })
}

/** Sends stored bytes with headers that keep the browser from guessing or caching them publicly. */
export async function sendStoredFile(event: H3Event, key: string, mimeType: string, downloadName: string) {
  // The fs driver answers a Buffer, the object-store driver an ArrayBuffer.
  const raw = await useStorage('uploads').getItemRaw<Buffer | ArrayBuffer>(key)
  if (!raw) throw createError({ statusCode: 404, statusMessage: 'File not found' })
  const bytes = Buffer.isBuffer(raw) ? raw : Buffer.from(raw)
  setResponseHeaders(event, {
    'content-type': mimeType,
    'content-length': bytes.length,
    'cache-control': 'private, max-age=300',
    'x-content-type-options': 'nosniff',
    'content-disposition': `${mimeType === 'application/pdf' ? 'attachment' : 'inline'}; filename="${downloadName.replace(/[^\w.-]/g, '_')}"`,
  })
  return bytes
}

/** Removes test photos that waited a day without a reading: rows (with audit) first, then their bytes. Returns how many. */
export async function removeExpiredPendingPhotos(now: Date): Promise<number> {
  const removed = await writeTransaction(db => removeExpiredPendingPhotoRows(db, now))
  const storage = useStorage('uploads')
  for (const upload of removed) {
    await storage.removeItem(upload.storageKey)
    if (upload.thumbnailKey) await storage.removeItem(upload.thumbnailKey)
  }
  return removed.length
}
