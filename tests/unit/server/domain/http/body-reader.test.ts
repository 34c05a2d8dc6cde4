/**
 * The body reader hands every piece to its sink before it says the body was read (the last
 * piece's 'end' comes while the stream waits for a slow sink), stops handing on past the limit
 * or once the sink refuses while reading the rest away, and cuts off a sender that announces
 * more than the drain allowance.
 */
import type { IncomingMessage } from 'node:http'
import { PassThrough } from 'node:stream'
import { setTimeout as sleep } from 'node:timers/promises'
import { describe, expect, it } from 'vitest'
import { drainAllowance } from '../../../../../server/domain/http/body-limits'
import { readBodyWithin } from '../../../../../server/domain/http/body-reader'

/** A request whose body is `pieces`, written as the reader asks for them. */
function requestOf(pieces: string[], headers: Record<string, string> = {}): IncomingMessage {
  const stream = new PassThrough()
  const req = Object.assign(stream, { headers, complete: false }) as unknown as IncomingMessage
  stream.on('end', () => Object.assign(req, { complete: true }))
  void (async () => {
    for (const piece of pieces) {
      if (!stream.write(piece)) await new Promise(resolve => stream.once('drain', resolve))
    }
    stream.end()
  })()
  return req
}

describe('reading a request body into a sink', () => {
  it('says the body was read only once a slow sink has taken the last piece', async () => {
    const pieces = Array.from({ length: 20 }, (_, i) => `piece ${i};`)
    const taken: string[] = []
    const body = await readBodyWithin(requestOf(pieces), 1024, {
      write: async (piece) => {
        await sleep(2)
        taken.push(piece.toString())
        return true
      },
    })
    expect(body.outcome).toBe('read')
    expect(taken.join('')).toBe(pieces.join(''))
    expect(body.bytes).toBe(pieces.join('').length)
  })

  it('hands nothing on past the limit or after a refusal, and reads the rest away', async () => {
    const taken: string[] = []
    const sink = {
      write: (piece: Buffer) => {
        taken.push(piece.toString())
        return true
      },
    }
    const large = await readBodyWithin(requestOf(['a'.repeat(600), 'b'.repeat(600), 'c'.repeat(10)]), 1000, sink)
    expect(large.outcome).toBe('too-large')
    await large.rest
    expect(taken.join('')).toBe('a'.repeat(600))

    taken.length = 0
    const refused = await readBodyWithin(requestOf(['one', 'two', 'three']), 1000, { write: piece => piece.toString() !== 'two' && sink.write(piece) })
    expect(refused.outcome).toBe('refused')
    await refused.rest
    expect(taken).toEqual(['one'])
  })

  it('cuts off a sender that announces more than the drain allowance', async () => {
    const req = requestOf(['x'], { 'content-length': String(drainAllowance(1000) + 1) })
    const body = await readBodyWithin(req, 1000, { write: () => true })
    expect(body.outcome).toBe('too-large')
    expect(req.destroyed).toBe(true)
  })
})
