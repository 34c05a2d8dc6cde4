import { describe, expect, it } from 'vitest'
import { signedFieldsInWords } from '../../../../../server/domain/sign-off/signed-record'

describe('signedFieldsInWords', () => {
  it('names the signed fields a change touches in words, with the verb that fits', () => {
    expect(signedFieldsInWords(['name'])).toBe('its name is')
    expect(signedFieldsInWords(['shape', 'dimensions', 'volumeLitres'])).toBe('its shape, dimensions and volume (L) are')
    expect(signedFieldsInWords(['clientId', 'cycleMethod'])).toBe('its client and cycle method are')
  })
})
