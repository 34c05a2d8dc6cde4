/**
 * Request bodies are read here, once, counting bytes as they arrive: whatever the method,
 * whether framed by Content-Length or sent chunked. Past the route's limit
 * (server/domain/http/body-limits.ts) nothing more is kept and the answer is 413; a
 * sender that keeps going is cut off. What was read is handed to h3's body readers.
 */
import type { IncomingMessage } from 'node:http'
import { bodyLimitFor, drainAllowance } from '../domain/http/body-limits'

function hasBody(req: IncomingMessage): boolean {
  return Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined
}

/** The body, or null once it is past `limit` (the rest drained, or the connection cut off). */
async function readWithin(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  // Announced as too large: answer at once without reading it.
  if (Number(req.headers['content-length']) > limit) return null
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of req) {
    total += (chunk as Buffer).length
    if (total <= limit) chunks.push(chunk as Buffer)
    else if (total > drainAllowance(limit)) {
      req.destroy()
      return null
    }
  }
  return total <= limit ? Buffer.concat(chunks, total) : null
}

export default defineEventHandler(async (event) => {
  const req = event.node.req
  if (!hasBody(req)) return
  const limit = bodyLimitFor(event.path)
  const body = await readWithin(req, limit)
  if (!body) {
    setResponseHeader(event, 'connection', 'close')
    throw createError({ statusCode: 413, statusMessage: 'Request too large', message: `This request may carry at most ${Math.round(limit / 1024)} KB.` })
  }
  // h3's readBody/readRawBody/readMultipartFormData take an already-read body from here.
  ;(req as IncomingMessage & { body?: Buffer }).body = body
})
