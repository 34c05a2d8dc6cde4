/**
 * Choosing a response's encoding from Accept-Encoding (RFC 9110 §12.5.3: q=0 means "not
 * acceptable", `*` stands for any coding not named) and which answers are worth compressing.
 */
import { describe, expect, it } from 'vitest'
import { chooseCoding, isCompressibleType } from '#server/utils/response-encoding'

describe('chooseCoding', () => {
  it('takes Brotli when Chromium offers it, gzip when only gzip is offered', () => {
    expect(chooseCoding('gzip, deflate, br, zstd')).toBe('br')
    expect(chooseCoding('gzip, deflate')).toBe('gzip')
    expect(chooseCoding('GZIP')).toBe('gzip')
  })

  it('answers uncompressed without Accept-Encoding, with identity only, or when every coding is refused', () => {
    expect(chooseCoding(undefined)).toBeNull()
    expect(chooseCoding('')).toBeNull()
    expect(chooseCoding('identity')).toBeNull()
    expect(chooseCoding('br;q=0, gzip;q=0')).toBeNull()
    expect(chooseCoding('*;q=0')).toBeNull()
  })

  it('honours the weights and the wildcard', () => {
    expect(chooseCoding('br;q=0.2, gzip;q=0.8')).toBe('gzip')
    expect(chooseCoding('br;q=0, *')).toBe('gzip')
    expect(chooseCoding('*')).toBe('br')
  })
})

describe('isCompressibleType', () => {
  it('compresses pages, JSON, CSV, scripts and styles', () => {
    for (const type of ['text/html;charset=utf-8', 'application/json', 'text/csv; charset=utf-8', 'application/javascript', 'text/css', 'image/svg+xml']) {
      expect(isCompressibleType(type), type).toBe(true)
    }
  })

  it('leaves already-compressed files and streams alone', () => {
    for (const type of ['application/pdf', 'image/png', 'image/jpeg', 'image/webp', 'text/event-stream', 'font/woff2', 'application/octet-stream', undefined]) {
      expect(isCompressibleType(type), String(type)).toBe(false)
    }
  })
})
