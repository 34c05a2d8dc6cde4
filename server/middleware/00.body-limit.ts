/**
 * Request bodies are read here, once, counting bytes as they arrive: whatever the method,
 * whether framed by Content-Length or sent chunked (server/domain/http/body-reader.ts). Past
 * the route's limit (server/domain/http/body-limits.ts) nothing more is kept and the answer is
 * 413, once the rest is read; a sender that keeps going far past it is cut off. What was read
 * is handed to h3's body readers. A route that streams its body itself (a CSV file sent as it
 * is) reads it there, under the same limit.
 */
import type { IncomingMessage } from 'node:http'
import { bodyLimitFor, streamsOwnBody } from '#server/domain/http/body-limits'
import { readBodyWithin } from '#server/domain/http/body-reader'
import { refuseBody } from '#server/utils/body-refusal'

function hasBody(req: IncomingMessage): boolean {
  return Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined
}

export default defineEventHandler(async (event) => {
  const req = event.node.req
  if (!hasBody(req) || streamsOwnBody(event.path, req.headers['content-type'])) return
  const limit = bodyLimitFor(event.path)
  let pieces: Buffer[] = []
  const body = await readBodyWithin(req, limit, {
    write: (piece) => {
      pieces.push(piece)
      return true
    },
  })
  if (body.outcome === 'too-large') {
    pieces = [] // nothing more is kept while the rest is read
    await body.rest
    refuseBody('too-large', limit)
  }
  if (body.outcome !== 'read') refuseBody('cut', limit)
  // h3's readBody/readRawBody/readMultipartFormData take an already-read body from here.
  ;(req as IncomingMessage & { body?: Buffer }).body = Buffer.concat(pieces, body.bytes)
})
