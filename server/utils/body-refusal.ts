/**
 * The answer to a request body that was not read whole, the same for every way a body is read
 * (the body-limit middleware, and a route that streams its body itself, as the CSV import does):
 * 413 past the route's limit, with the words the forms show beside their field; 400 when the
 * sender went away before its body ended.
 */
import { bodyTooLarge } from '#server/domain/http/body-limits'

export function refuseBody(outcome: 'too-large' | 'cut', limit: number): never {
  if (outcome === 'too-large') {
    const { message, issues } = bodyTooLarge(limit)
    throw createError({ statusCode: 413, statusMessage: 'Request too large', message, data: issues ? { issues } : undefined })
  }
  throw createError({ statusCode: 400, statusMessage: 'The request ended before its body did.' })
}
