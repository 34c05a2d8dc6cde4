import { promisify } from 'node:util'
import { brotliCompress, constants, gzip } from 'node:zlib'
import { chooseCoding, isCompressibleType, MIN_COMPRESSED_BYTES } from '#server/utils/response-encoding'

const brotli = promisify(brotliCompress)
const gzipAsync = promisify(gzip)

/**
 * Compresses rendered pages and JSON/CSV answers for browsers that accept it (Brotli or
 * gzip, from Accept-Encoding), with Vary: Accept-Encoding so a cache keeps both forms.
 * Runs as the last beforeResponse hook, after nuxt-security has set its headers, on the
 * body h3 is about to send: a string (a page) or a plain object/array (JSON, serialised
 * here as h3 would). Streams (server-sent events), Web Responses and byte bodies of other
 * types (photos, PDFs) pass untouched. Static files under /_nuxt are compressed at build
 * time instead (nitro.compressPublicAssets in nuxt.config.ts).
 * Levels are chosen for speed on every request: Brotli 4 and gzip 6. Error pages go out
 * uncompressed (see the /__nuxt_error check).
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    if (event.handled || event.method === 'HEAD') return
    // Nuxt renders an error page by fetching /__nuxt_error inside the server with the
    // browser's headers, reads that answer as text and sends it on: compressed here, it
    // would reach the browser as garbled bytes (Chromium shows its own error page).
    if (getRequestHeader(event, 'x-nuxt-error') || event.path.startsWith('/__nuxt_error')) return
    const status = getResponseStatus(event)
    if (status === 204 || status === 304) return
    if (getResponseHeader(event, 'content-encoding')) return

    const body = response.body
    let type = getResponseHeader(event, 'content-type')?.toString()
    if (typeof body === 'string') type ??= 'text/html'
    else if (isPlainJson(body)) type ??= 'application/json'
    else if (!Buffer.isBuffer(body)) return
    if (!isCompressibleType(type)) return
    appendResponseHeader(event, 'vary', 'Accept-Encoding')
    // Decided before serialising, so an answer that stays plain (no Accept-Encoding, as from
    // the API benchmark's load generator) costs no second JSON.stringify.
    const coding = chooseCoding(getRequestHeader(event, 'accept-encoding'))
    if (!coding) return

    const bytes = typeof body === 'string' ? Buffer.from(body, 'utf8') : Buffer.isBuffer(body) ? body : Buffer.from(JSON.stringify(body), 'utf8')
    setResponseHeader(event, 'content-type', type!)
    if (bytes.length < MIN_COMPRESSED_BYTES) {
      response.body = bytes
      return
    }
    const compressed = coding === 'br'
      ? await brotli(bytes, { params: { [constants.BROTLI_PARAM_QUALITY]: 4, [constants.BROTLI_PARAM_SIZE_HINT]: bytes.length } })
      : await gzipAsync(bytes, { level: 6 })
    setResponseHeader(event, 'content-encoding', coding)
    removeResponseHeader(event, 'content-length')
    response.body = compressed
  })
})

/** A JSON answer as handlers return it: plain objects and arrays (not streams, buffers or errors). */
function isPlainJson(body: unknown): body is object {
  if (Array.isArray(body)) return true
  if (body === null || typeof body !== 'object') return false
  const proto = Object.getPrototypeOf(body)
  return proto === Object.prototype || proto === null
}
