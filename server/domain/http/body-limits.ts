/**
 * How many bytes of request body each route takes: one table for every method and
 * framing. JSON routes are small; the file uploads and the CSV import have their own.
 */
import { MAX_UPLOAD_BYTES, uploadTooLargeMessage } from '#shared/uploads/files'

const KB = 1024
const MB = 1024 * KB
/** Room for multipart boundaries and part headers around the file. */
export const MULTIPART_OVERHEAD_BYTES = 64 * KB

export const BODY_LIMITS = {
  /** Every JSON route: the largest form (a stage with notes and checklist) is a few KB. */
  json: 64 * KB,
  /** The plan template: up to 30 stages of 30 checklist items. */
  planTemplate: 1 * MB,
  /** Multipart uploads: one file of at most MAX_UPLOAD_BYTES (shared/uploads/files.ts, which the forms check too). */
  upload: MAX_UPLOAD_BYTES + MULTIPART_OVERHEAD_BYTES,
  /** CSV import, as JSON text or as the file itself (text/csv): 100,000 rows are about 8 MB. */
  import: 24 * MB,
} as const

const IMPORT_ROUTE = /^\/api\/tanks\/[^/]+\/readings\/import$/

const ROUTES: ReadonlyArray<[RegExp, number]> = [
  [IMPORT_ROUTE, BODY_LIMITS.import],
  [/^\/api\/tanks\/[^/]+\/stages\/[^/]+\/uploads$/, BODY_LIMITS.upload],
  [/^\/api\/tanks\/[^/]+\/test-photos$/, BODY_LIMITS.upload],
  [/^\/api\/plan-template$/, BODY_LIMITS.planTemplate],
]

/** The body limit, in bytes, for a request path (query string ignored). */
export function bodyLimitFor(path: string): number {
  const bare = path.split('?')[0]!
  return ROUTES.find(([pattern]) => pattern.test(bare))?.[1] ?? BODY_LIMITS.json
}

/**
 * Whether the route reads the body itself, as a stream, rather than the body-limit middleware
 * holding it whole: a CSV file sent as it is (text/csv) to the import, which writes it to a
 * temporary file as it arrives (server/utils/csv-upload.ts).
 */
export function streamsOwnBody(path: string, contentType: string | undefined): boolean {
  return (contentType ?? '').toLowerCase().startsWith('text/csv') && IMPORT_ROUTE.test(path.split('?')[0]!)
}

/** A refusal for a body past its limit, with the field a form shows it beside when there is one. */
export interface BodyTooLarge {
  message: string
  issues?: Array<{ field: string, message: string }>
}

/**
 * What a 413 for this limit says: for an upload, the file's own limit beside the file field
 * (the same words the upload route and the forms use); otherwise the body's size in KB.
 */
export function bodyTooLarge(limit: number): BodyTooLarge {
  if (limit === BODY_LIMITS.upload) {
    const message = uploadTooLargeMessage()
    return { message, issues: [{ field: 'file', message }] }
  }
  return { message: `This request may carry at most ${Math.round(limit / 1024)} KB.` }
}

/**
 * After the limit is passed the rest is read and thrown away, so an honest client that
 * sent a little too much still reads its 413; a sender that goes on past this many bytes
 * more is cut off.
 */
export function drainAllowance(limit: number): number {
  return Math.max(4 * limit, 4 * MB)
}
