/**
 * A local stand-in for S3-compatible object storage, for dev, demo and tests: PUT, GET,
 * HEAD and DELETE of objects under /<bucket>/<key>, and a ListObjects answer for
 * /<bucket>. Objects live in memory. It insists on a signed request (an AWS4
 * Authorization header) but does not verify signatures: it stands in for the service,
 * not for its security. Run it alone with `npx tsx scripts/fake-object-store.ts [port]`.
 */
import { createServer, type IncomingMessage, type Server } from 'node:http'
import type { AddressInfo } from 'node:net'

export interface FakeObjectStore {
  url: string
  /** Stored objects by "bucket/key". */
  objects: Map<string, Buffer>
  stop: () => Promise<void>
}

function readBody(request: IncomingMessage): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    request.on('data', (chunk: Buffer) => chunks.push(chunk))
    request.on('end', () => resolve(Buffer.concat(chunks)))
    request.on('error', reject)
  })
}

function listXml(bucket: string, keys: string[]): string {
  const contents = keys.map(key => `<Contents><Key>${key.replace(/&/g, '&amp;').replace(/</g, '&lt;')}</Key></Contents>`).join('')
  return `<?xml version="1.0" encoding="UTF-8"?><ListBucketResult><Name>${bucket}</Name>${contents}</ListBucketResult>`
}

/** Starts the fake on 127.0.0.1 (port 0 = any free port). */
export function startFakeObjectStore(port = 0): Promise<FakeObjectStore> {
  const objects = new Map<string, Buffer>()
  const server: Server = createServer(async (request, response) => {
    if (!request.headers.authorization?.startsWith('AWS4-HMAC-SHA256')) {
      response.writeHead(403).end('unsigned request')
      return
    }
    const path = decodeURIComponent(new URL(request.url ?? '/', 'http://fake').pathname).replace(/^\/+/, '')
    const [bucket = '', ...rest] = path.split('/')
    const key = rest.join('/')
    const id = `${bucket}/${key}`
    if (!key && request.method === 'GET') {
      const keys = [...objects.keys()].filter(k => k.startsWith(`${bucket}/`)).map(k => k.slice(bucket.length + 1))
      response.writeHead(200, { 'content-type': 'application/xml' }).end(listXml(bucket, keys))
      return
    }
    switch (request.method) {
      case 'PUT':
        objects.set(id, await readBody(request))
        response.writeHead(200).end()
        return
      case 'GET':
      case 'HEAD': {
        const body = objects.get(id)
        if (!body) response.writeHead(404).end()
        else response.writeHead(200, { 'content-length': body.length }).end(request.method === 'GET' ? body : undefined)
        return
      }
      case 'DELETE':
        objects.delete(id)
        response.writeHead(204).end()
        return
      default:
        response.writeHead(405).end()
    }
  })
  return new Promise((resolve) => {
    server.listen(port, '127.0.0.1', () => {
      const { port: bound } = server.address() as AddressInfo
      resolve({
        url: `http://127.0.0.1:${bound}`,
        objects,
        stop: () => new Promise(done => server.close(() => done())),
      })
    })
  })
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const store = await startFakeObjectStore(Number(process.argv[2] ?? 9000))
  console.log(`Fake object store on ${store.url} (objects kept in memory until it stops)`)
}
