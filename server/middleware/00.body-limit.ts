/**
 * Request bodies are read here, once, counting bytes as they arrive: whatever the method,
 * whether framed by Content-Length or sent chunked. Past the route's limit
 * (server/domain/http/body-limits.ts) nothing more is kept and the 413 goes out at once;
 * the rest of the body is read and thrown away so the sender can read the answer, and a
 * sender that goes on past the drain allowance is cut off. What was read is handed to
 * h3's body readers.
 */
import type { IncomingMessage } from 'node:http'
import { bodyLimitFor, drainAllowance } from '../domain/http/body-limits'

function hasBody(req: IncomingMessage): boolean {
  return Number(req.headers['content-length'] ?? 0) > 0 || req.headers['transfer-encoding'] !== undefined
}

/** Reads and discards what is left of the body; past `allowance` more bytes the connection is cut. */
function discardRest(req: IncomingMessage, allowance: number): void {
  let discarded = 0
  req.on('data', (chunk: Buffer) => {
    discarded += chunk.length
    if (discarded > allowance) req.destroy()
  })
  req.on('error', () => {})
  req.resume()
}

/** The body, or null as soon as it passes `limit` (the rest is then discarded in the background). */
function readWithin(req: IncomingMessage, limit: number): Promise<Buffer | null> {
  // Announced as too large: answer at once without keeping any of it.
  if (Number(req.headers['content-length']) > limit) {
    discardRest(req, drainAllowance(limit))
    return Promise.resolve(null)
  }
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let total = 0
    const stop = () => {
      req.off('data', onData)
      req.off('end', onEnd)
      req.off('error', onError)
    }
    const onData = (chunk: Buffer) => {
      total += chunk.length
      if (total <= limit) {
        chunks.push(chunk)
        return
      }
      stop()
      chunks.length = 0
      discardRest(req, drainAllowance(limit))
      resolve(null)
    }
    const onEnd = () => {
      stop()
      resolve(Buffer.concat(chunks, total))
    }
    const onError = (error: Error) => {
      stop()
      reject(error)
    }
    req.on('data', onData)
    req.on('end', onEnd)
    req.on('error', onError)
  })
}

export default defineEventHandler(async (event) => {
  const req = event.node.req
  if (!hasBody(req)) return
  const limit = bodyLimitFor(event.path)
  const body = await readWithin(req, limit)
  if (!body) throw createError({ statusCode: 413, statusMessage: 'Request too large', message: `This request may carry at most ${Math.round(limit / 1024)} KB.` })
  // h3's readBody/readRawBody/readMultipartFormData take an already-read body from here.
  ;(req as IncomingMessage & { body?: Buffer }).body = body
})
