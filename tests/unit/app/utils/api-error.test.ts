import * as v from 'valibot'
import { describe, expect, it } from 'vitest'
import { apiErrorMessage, schemaFieldErrors, serverFieldErrors } from '../../../../app/utils/api-error'

/** The shape ofetch gives a failed request: the server's JSON body under `data`. */
const failed = (data: unknown) => Object.assign(new Error('request failed'), { data })

describe('apiErrorMessage', () => {
  it('prefers the status message, then the message, then the fallback', () => {
    expect(apiErrorMessage(failed({ statusMessage: 'Tank not found', message: 'x' }), 'fallback')).toBe('Tank not found')
    expect(apiErrorMessage(failed({ message: 'Too many attempts' }), 'fallback')).toBe('Too many attempts')
    expect(apiErrorMessage(new TypeError('fetch failed'), 'Check your connection.')).toBe('Check your connection.')
    expect(apiErrorMessage(null, 'fallback')).toBe('fallback')
  })
})

describe('serverFieldErrors', () => {
  it('keeps the first message for each field of a 400', () => {
    const error = failed({ statusMessage: 'Validation Error', data: { issues: [
      { field: 'name', message: 'Name the tank.' },
      { field: 'dimensions.lengthMm', message: 'Too long.' },
      { field: 'name', message: 'A second complaint' },
    ] } })
    expect(serverFieldErrors(error)).toEqual({ 'name': 'Name the tank.', 'dimensions.lengthMm': 'Too long.' })
  })
  it('is null when the server named no field', () => {
    expect(serverFieldErrors(failed({ statusMessage: 'Conflict' }))).toBeNull()
    expect(serverFieldErrors(failed({ data: { issues: [] } }))).toBeNull()
    expect(serverFieldErrors(undefined)).toBeNull()
  })
})

describe('schemaFieldErrors', () => {
  it('names nested fields by their path and the whole body as (body)', () => {
    const schema = v.object({ name: v.pipe(v.string(), v.minLength(1, 'Name it.')), dims: v.object({ lengthMm: v.number('A number.') }) })
    const result = v.safeParse(schema, { name: '', dims: { lengthMm: 'x' } })
    expect(result.success).toBe(false)
    if (!result.success) expect(schemaFieldErrors(result.issues)).toEqual({ 'name': 'Name it.', 'dims.lengthMm': 'A number.' })
    const whole = v.safeParse(schema, 'not an object')
    if (!whole.success) expect(Object.keys(schemaFieldErrors(whole.issues))).toEqual(['(body)'])
  })
})
