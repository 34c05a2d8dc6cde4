import { describe, expect, it } from 'vitest'
import { detectFileType, extensionOf, fileTypeProblem } from '../../../../server/utils/file-type'

const bytes = (...b: number[]) => new Uint8Array(b)

describe('detectFileType', () => {
  it('reads the magic numbers of the accepted types', () => {
    expect(detectFileType(bytes(0xFF, 0xD8, 0xFF, 0xE0))).toBe('image/jpeg')
    expect(detectFileType(bytes(0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0))).toBe('image/png')
    expect(detectFileType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WEBPVP8 '))).toBe('image/webp')
    expect(detectFileType(new TextEncoder().encode('%PDF-1.7'))).toBe('application/pdf')
  })

  it('rejects look-alikes and short input', () => {
    expect(detectFileType(new TextEncoder().encode('RIFF\u0000\u0000\u0000\u0000WAVEfmt '))).toBeNull()
    expect(detectFileType(bytes(0x89, 0x50, 0x4E))).toBeNull()
    expect(detectFileType(new TextEncoder().encode('GIF89a'))).toBeNull()
    expect(detectFileType(bytes())).toBeNull()
  })
})

describe('fileTypeProblem', () => {
  it('accepts a matching or missing extension, refuses a lying one', () => {
    expect(fileTypeProblem('tank.JPEG', 'image/jpeg')).toBeNull()
    expect(fileTypeProblem('scan', 'application/pdf')).toBeNull()
    expect(fileTypeProblem('photo.png', 'application/pdf')).toContain('named .png but its content is a PDF document')
    expect(fileTypeProblem('photo.png', null)).toContain('Only JPEG, PNG or WebP')
    expect(extensionOf('a/b.c/.hidden')).toBe('')
    expect(extensionOf('C:\\x\\y.Pdf')).toBe('pdf')
  })
})
