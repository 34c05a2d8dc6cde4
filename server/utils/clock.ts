import type { H3Event } from 'h3'

/** Header a test may send to move the server's clock for one request (only with NUXT_TEST_HOOKS=1). */
export const TEST_NOW_HEADER = 'x-tidewright-test-now'

/** The time a request acts at: the real clock, or the test clock header when test hooks are on. */
export function requestNow(event: H3Event): Date {
  if (isOn(useRuntimeConfig().testHooks)) {
    const value = getHeader(event, TEST_NOW_HEADER)
    const at = value ? new Date(value) : null
    if (at && !Number.isNaN(at.getTime())) return at
  }
  return new Date()
}
