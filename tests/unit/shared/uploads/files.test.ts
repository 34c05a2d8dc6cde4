import { describe, expect, it } from 'vitest'
import { acceptAttribute, acceptedTypesWords, extensionOf, looksAccepted, MAX_UPLOAD_BYTES, PHOTO_TYPES, uploadTooLargeMessage } from '../../../../shared/uploads/files'
import { BODY_LIMITS } from '../../../../server/domain/http/body-limits'

describe('upload files', () => {
  it('has one limit: the words and the upload body limit are made from it', () => {
    expect(MAX_UPLOAD_BYTES).toBe(10 * 1024 * 1024)
    expect(uploadTooLargeMessage()).toBe('Files are at most 10 MB.')
    expect(BODY_LIMITS.upload).toBeGreaterThan(MAX_UPLOAD_BYTES)
    expect(BODY_LIMITS.upload - MAX_UPLOAD_BYTES).toBeLessThanOrEqual(64 * 1024)
  })

  it('names the accepted kinds for a plan file and for a test photo', () => {
    expect(acceptedTypesWords()).toBe('JPEG, PNG or WebP photos and PDF documents')
    expect(acceptedTypesWords(PHOTO_TYPES)).toBe('JPEG, PNG or WebP photos')
    expect(acceptAttribute(PHOTO_TYPES)).toBe('image/jpeg,image/png,image/webp')
  })

  it('guesses the kind from the name, or from the browser\'s type when the name has no extension', () => {
    expect(looksAccepted({ name: 'Tank.JPG' })).toBe(true)
    expect(looksAccepted({ name: 'survey.pdf' })).toBe(true)
    expect(looksAccepted({ name: 'survey.pdf' }, PHOTO_TYPES)).toBe(false)
    expect(looksAccepted({ name: 'tests.csv', type: 'text/csv' })).toBe(false)
    expect(looksAccepted({ name: 'scan', type: 'application/pdf' })).toBe(true)
    expect(looksAccepted({ name: 'scan', type: '' })).toBe(false)
    expect(extensionOf('a/b.c/.hidden')).toBe('')
  })
})
