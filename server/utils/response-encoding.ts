/**
 * Which compressed encoding an answer gets, decided from the request's Accept-Encoding and
 * the answer's type: Brotli where the browser takes it (smaller), else gzip; none for bodies
 * that are already compressed (images, PDFs) or sent as a stream (server-sent events).
 */
export type ContentCoding = 'br' | 'gzip'

/** Text worth compressing: pages, JSON, CSV, scripts, styles, SVG. */
const COMPRESSIBLE_TYPE = /^(?:text\/(?:html|plain|csv|css|javascript)|application\/(?:json|javascript|xml|problem\+json)|image\/svg\+xml)\b/i

/** Below this a compressed body saves less than its own headers cost. */
export const MIN_COMPRESSED_BYTES = 1024

export function isCompressibleType(contentType: string | undefined): boolean {
  return !!contentType && COMPRESSIBLE_TYPE.test(contentType)
}

/** The coding to use for this Accept-Encoding, or null for an identity answer (q=0 refuses a coding). */
export function chooseCoding(acceptEncoding: string | undefined): ContentCoding | null {
  if (!acceptEncoding) return null
  const accepted = new Map<string, number>()
  for (const part of acceptEncoding.split(',')) {
    const [name, ...params] = part.trim().toLowerCase().split(';')
    const q = params.map(p => p.trim()).find(p => p.startsWith('q='))
    accepted.set(name!, q ? Number(q.slice(2)) || 0 : 1)
  }
  const weight = (coding: string) => accepted.get(coding) ?? accepted.get('*') ?? 0
  if (weight('br') > 0 && weight('br') >= weight('gzip')) return 'br'
  if (weight('gzip') > 0) return 'gzip'
  return null
}
