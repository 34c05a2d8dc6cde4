/**
 * Tidewright's local SMTP catcher for dev, demo and tests: accepts every message on a
 * local port, stores it as one JSON line per message, and never delivers anything.
 * The server shows what was caught on /admin/mail and GET /api/dev/mail (NUXT_DEV_MAIL=1).
 *
 * As a script: `tsx scripts/mail-catcher.ts` (MAIL_CATCHER_PORT, default 2525;
 * MAIL_CATCHER_FILE, default data/mail-caught.jsonl). As a module: startMailCatcher().
 * An optional control port lets tests stop and restart the SMTP listener (an outage).
 */
import { appendFileSync, existsSync, mkdirSync, readFileSync } from 'node:fs'
import { createServer as createHttpServer, type Server as HttpServer } from 'node:http'
import { dirname, resolve } from 'node:path'
import { pathToFileURL } from 'node:url'
import { SMTPServer } from 'smtp-server'
import type { CaughtMail } from '../shared/types/mail'

export type { CaughtMail }

function decodeQuotedPrintable(body: string): string {
  const bytes = body.replace(/=\r?\n/g, '').replace(/=([0-9A-F]{2})/gi, (_, hex: string) => String.fromCharCode(Number.parseInt(hex, 16)))
  return Buffer.from(bytes, 'latin1').toString('utf8')
}

function decodeWord(value: string): string {
  return value.replace(/=\?utf-8\?([BQ])\?([^?]*)\?=/gi, (_, enc: string, text: string) => enc.toUpperCase() === 'B'
    ? Buffer.from(text, 'base64').toString('utf8')
    : decodeQuotedPrintable(text.replace(/_/g, ' '))).replace(/\?=\s+=\?/g, '')
}

function splitPart(raw: string): { headers: Record<string, string>, body: string } {
  const at = raw.search(/\r?\n\r?\n/)
  const head = at === -1 ? raw : raw.slice(0, at)
  const body = at === -1 ? '' : raw.slice(at).replace(/^\r?\n\r?\n/, '')
  const headers: Record<string, string> = {}
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':')
    if (colon > 0) headers[line.slice(0, colon).trim().toLowerCase()] = line.slice(colon + 1).trim()
  }
  return { headers, body }
}

function decodeBody(headers: Record<string, string>, body: string): string {
  const encoding = (headers['content-transfer-encoding'] ?? '7bit').toLowerCase()
  if (encoding === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8')
  if (encoding === 'quoted-printable') return decodeQuotedPrintable(body)
  return body
}

/** Reads the text and HTML parts of a plain or multipart/alternative message. */
export function parseMail(raw: string): Pick<CaughtMail, 'headers' | 'text' | 'html' | 'subject' | 'messageId' | 'from' | 'to'> {
  const { headers, body } = splitPart(raw)
  let text = ''
  let html: string | null = null
  const boundary = /boundary="?([^";]+)"?/i.exec(headers['content-type'] ?? '')?.[1]
  if (boundary) {
    for (const chunk of body.split(`--${boundary}`).slice(1)) {
      if (chunk.startsWith('--')) break
      const part = splitPart(chunk.replace(/^\r?\n/, ''))
      const type = (part.headers['content-type'] ?? 'text/plain').toLowerCase()
      const decoded = decodeBody(part.headers, part.body).replace(/\r?\n$/, '')
      if (type.startsWith('text/html')) html = decoded
      else if (type.startsWith('text/plain')) text = decoded
    }
  }
  else if ((headers['content-type'] ?? 'text/plain').toLowerCase().startsWith('text/html')) {
    html = decodeBody(headers, body)
  }
  else {
    text = decodeBody(headers, body)
  }
  return {
    headers,
    text: text.replace(/\r\n/g, '\n'),
    html,
    subject: decodeWord(headers.subject ?? ''),
    messageId: headers['message-id'] ?? '',
    from: decodeWord(headers.from ?? ''),
    to: decodeWord(headers.to ?? ''),
  }
}

/** Every message caught so far in the file, oldest first. */
export function readCaughtMail(file: string): CaughtMail[] {
  if (!existsSync(file)) return []
  return readFileSync(file, 'utf8').split('\n').filter(Boolean).map(line => JSON.parse(line) as CaughtMail)
}

export interface MailCatcher {
  port: number
  file: string
  /** Control URL (POST /smtp/stop, POST /smtp/start, GET /messages) when a control port was asked for. */
  controlURL: string | null
  /** Closes the SMTP listener: senders get "connection refused", as with a mail server that is down. */
  stopSmtp: () => Promise<void>
  /** Listens again on the same port. */
  startSmtp: () => Promise<void>
  close: () => Promise<void>
}

function smtpServer(file: string): SMTPServer {
  return new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    banner: 'Tidewright mail catcher',
    logger: false,
    onAuth(_auth, _session, callback) { callback(null, { user: 'catcher' }) },
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (chunk: Buffer) => chunks.push(chunk))
      stream.on('end', () => {
        const raw = Buffer.concat(chunks).toString('utf8')
        const mail: CaughtMail = {
          receivedAt: new Date().toISOString(),
          envelopeFrom: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
          envelopeTo: session.envelope.rcptTo.map(r => r.address),
          ...parseMail(raw),
        }
        appendFileSync(file, `${JSON.stringify(mail)}\n`)
        callback()
      })
    },
  })
}

/** Starts the catcher on 127.0.0.1 (port 0 picks a free one). */
export async function startMailCatcher(options: { port?: number, file: string, controlPort?: number }): Promise<MailCatcher> {
  const file = resolve(options.file)
  mkdirSync(dirname(file), { recursive: true })
  let server: SMTPServer | null = null
  let port = options.port ?? 0
  const startSmtp = () => new Promise<void>((done, fail) => {
    if (server) return done()
    const next = smtpServer(file)
    next.on('error', fail)
    next.listen(port, '127.0.0.1', () => {
      const address = next.server.address()
      if (address && typeof address === 'object') port = address.port
      server = next
      done()
    })
  })
  const stopSmtp = () => new Promise<void>((done) => {
    const current = server
    server = null
    if (!current) return done()
    current.close(() => done())
  })
  await startSmtp()

  let control: HttpServer | null = null
  let controlURL: string | null = null
  if (options.controlPort !== undefined) {
    control = createHttpServer((req, res) => {
      const reply = (status: number, body: unknown) => {
        res.writeHead(status, { 'content-type': 'application/json' })
        res.end(JSON.stringify(body))
      }
      const route = `${req.method} ${req.url}`
      if (route === 'POST /smtp/stop') stopSmtp().then(() => reply(200, { running: false }), e => reply(500, { error: String(e) }))
      else if (route === 'POST /smtp/start') startSmtp().then(() => reply(200, { running: true }), e => reply(500, { error: String(e) }))
      else if (route === 'GET /messages') reply(200, readCaughtMail(file))
      else reply(404, { error: 'not found' })
    })
    await new Promise<void>(done => control!.listen(options.controlPort, '127.0.0.1', () => done()))
    const address = control.address()
    controlURL = address && typeof address === 'object' ? `http://127.0.0.1:${address.port}` : null
  }

  return {
    get port() { return port },
    file,
    controlURL,
    stopSmtp,
    startSmtp,
    close: async () => {
      await stopSmtp()
      if (control) await new Promise<void>(done => control!.close(() => done()))
    },
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const catcher = await startMailCatcher({
    port: Number(process.env.MAIL_CATCHER_PORT ?? 2525),
    file: process.env.MAIL_CATCHER_FILE ?? 'data/mail-caught.jsonl',
  })
  console.log(`Tidewright mail catcher: smtp://127.0.0.1:${catcher.port}, messages in ${catcher.file}`)
  for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => void catcher.close().then(() => process.exit(0)))
}
