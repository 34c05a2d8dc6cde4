/**
 * A CSV file sent as the request's body (Content-Type: text/csv) for the import: streamed to
 * a temporary file in the server's temp dir as it arrives, never held whole, with the import's
 * limits held on the bytes actually read (a chunked body, a Content-Length that lies): past
 * the body limit, or past MAX_IMPORT_ROWS rows (counted as the bytes arrive, the way the form
 * counts a chosen file), the answer is 413 with the same words as for the file sent as JSON.
 * The temporary file lives only while the caller uses it.
 */
import { mkdtemp, open, rm } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { H3Event } from 'h3'
import { CsvRowCounter } from '#shared/readings/import-file'
import { importTooLargeMessage, MAX_IMPORT_ROWS } from '#shared/readings/limits'
import { UPLOAD_EMPTY_MESSAGE } from '#shared/uploads/files'
import { bodyLimitFor, streamsOwnBody } from '#server/domain/http/body-limits'
import { readBodyWithin } from '#server/domain/http/body-reader'
import { refuseBody } from './body-refusal'

/** Whether the request carries the file itself rather than JSON: the rule the body-limit middleware leaves such a body unread by. */
export function sendsCsvBody(event: H3Event): boolean {
  return streamsOwnBody(event.path, getRequestHeader(event, 'content-type'))
}

/** The 413 for a file of more than MAX_IMPORT_ROWS rows, however it was sent. */
export function importTooLarge(): never {
  const message = importTooLargeMessage()
  throw createError({ statusCode: 413, statusMessage: message, message })
}

/**
 * Streams the body to a temporary file and runs `use` with its path; the file (and its own
 * folder, readable by this user only) is removed afterwards, whatever happened. A refusal is
 * answered at once; the rest of the body is then read and thrown away (server/domain/http/body-reader.ts).
 */
export async function withCsvUpload<T>(event: H3Event, use: (path: string) => Promise<T>): Promise<T> {
  const limit = bodyLimitFor(event.path)
  const dir = await mkdtemp(join(tmpdir(), 'tidewright-import-'))
  try {
    const path = join(dir, 'upload.csv')
    const file = await open(path, 'wx', 0o600)
    const rows = new CsvRowCounter()
    let body
    try {
      body = await readBodyWithin(event.node.req, limit, {
        write: async (piece) => {
          rows.add(piece)
          if (rows.dataRows > MAX_IMPORT_ROWS) return false
          await file.write(piece)
          return true
        },
      })
    }
    finally {
      await file.close()
    }
    if (body.outcome === 'refused') importTooLarge()
    // The body-limit middleware's answers, for a body past the limit or cut short.
    if (body.outcome !== 'read') refuseBody(body.outcome, limit)
    if (body.bytes === 0) fieldError([{ field: 'csv', message: UPLOAD_EMPTY_MESSAGE }])
    return await use(path)
  }
  finally {
    await rm(dir, { recursive: true, force: true })
  }
}
