/**
 * Reads a request's body as it arrives, counting the bytes actually read (whatever the
 * Content-Length says, and for a chunked body that says nothing), and hands each piece to a
 * sink: the body-limit middleware keeps the pieces, the CSV import writes them to a file.
 * Past the limit, or once the sink refuses, nothing more is handed on; the rest is read and
 * thrown away so the sender can read the answer on the same connection (closing it while it
 * still writes would break it under the sender), and a sender that goes on past the drain
 * allowance, or announces that much, is cut off.
 */
import type { IncomingMessage } from 'node:http'
import { drainAllowance } from './body-limits'

/** Where the pieces go: `write` answers false to refuse the rest (a file with too many rows). */
export interface BodySink {
  write: (piece: Buffer) => boolean | Promise<boolean>
}

/** read: the whole body went to the sink; too-large: past the limit; refused: the sink said no; cut: the sender went away first. */
export type BodyOutcome = 'read' | 'too-large' | 'refused' | 'cut'

export interface BodyRead {
  outcome: BodyOutcome
  /** Bytes handed to the sink. */
  bytes: number
  /** Settles once the rest of a refused body is read (or cut off): an answer may wait for it, or go out at once. */
  rest: Promise<void>
}

/**
 * Reads `req` into `sink` within `limit` bytes; settles as soon as the outcome is known (see
 * the file's comment). A piece is handed on only after the last one was taken, so a slow sink
 * holds the sender back instead of the pieces piling up in memory.
 */
export function readBodyWithin(req: IncomingMessage, limit: number, sink: BodySink): Promise<BodyRead> {
  const allowance = drainAllowance(limit)
  let finish!: () => void
  const rest = new Promise<void>((resolve) => {
    finish = resolve
  })
  return new Promise<BodyRead>((resolve, reject) => {
    let read = 0
    let taken = 0
    let outcome: BodyOutcome | null = null
    const decide = (found: BodyOutcome) => {
      if (outcome) return
      outcome = found
      resolve({ outcome, bytes: taken, rest })
    }
    if (Number(req.headers['content-length']) > allowance) {
      req.destroy()
      decide('too-large')
      finish()
      return
    }
    // The piece being taken: the last piece's 'end' (and 'close') come even while the stream is paused for it.
    let taking = Promise.resolve()
    req.on('data', (piece: Buffer) => {
      read += piece.length
      if (outcome) {
        if (read > allowance) req.destroy()
        return
      }
      if (read > limit) return decide('too-large')
      req.pause()
      taking = Promise.resolve(sink.write(piece)).then((ok) => {
        if (ok) taken += piece.length
        else decide('refused')
        req.resume()
      }, (error: unknown) => {
        req.destroy()
        reject(error)
      })
    })
    req.on('end', () => void taking.then(() => {
      decide('read')
      finish()
    }))
    // After 'end' too; before it, the sender went away or was cut off.
    req.on('close', () => void taking.then(() => {
      decide(req.complete ? 'read' : 'cut')
      finish()
    }))
  })
}
