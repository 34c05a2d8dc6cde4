/**
 * Request bodies are read here, once, counting bytes as they arrive: whatever the method,
 * whether framed by Content-Length or sent chunked. Past the route's limit
 * (server/domain/http/body-limits.ts) nothing more is kept and the answer is 413; a
 * sender that keeps going far past it is cut off. What was read is handed to h3's body readers.
 */
import type { IncomingMessage } from 'node:http'
import { bodyLimitFor, bodyTooLarge, drainAllowance } from '#server/domain/http/body-limits'

function hasBody(req: IncomingMessage): boolean {
  return Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined
}

/**
 * The body, or null once it is past `limit`. Past the limit nothing more is kept, but the
 * rest is read to its end so the sender can read the 413 on the same connection (answering
 * while it still writes would break the connection under it). A sender that goes on past
 * the drain allowance, or announces that much, is cut off.
 */
async function readWithin(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  const allowance = drainAllowance(limit)
  if (Number(req.headers['content-length']) > allowance) {
    req.destroy()
    return null
  }
  const chunks: Buffer[] = []
  let total = 0
  for await (const chunk of req) {
    total += (chunk as Buffer).length
    if (total <= limit) chunks.push(chunk as Buffer)
    else if (total > allowance) {
      req.destroy()
      return null
    }
    else if (chunks.length) chunks.length = 0
  }
  return total <= limit ? Buffer.concat(chunks, total) : null
}

export default defineEventHandler(async (event) => {
  const req = event.node.req
  if (!hasBody(req)) return
  const limit = bodyLimitFor(event.path)
  const body = await readWithin(req, limit)
  if (!body) {
    const { message, issues } = bodyTooLarge(limit)
    throw createError({ statusCode: 413, statusMessage: 'Request too large', message, data: issues ? { issues } : undefined })
  }
  // h3's readBody/readRawBody/readMultipartFormData take an already-read body from here.
  ;(req as IncomingMessage & { body?: Buffer }).body = body
})
