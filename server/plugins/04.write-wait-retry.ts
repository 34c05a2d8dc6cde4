import { WriteWaitExceeded } from '#server/db/write-wait'

/** Seconds a writer refused for a busy database is told to wait before trying again. */
const RETRY_AFTER_SECONDS = 2

/**
 * A write that waited for the database's lock past its bound (`writeTransaction`) is answered
 * 503 with Retry-After, whichever route or glue it came from. Nitro calls error hooks before
 * its error handler writes the answer, and headers set by then are kept.
 */
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('error', (error, { event }) => {
    if (event && (error as { cause?: unknown }).cause instanceof WriteWaitExceeded) setResponseHeader(event, 'Retry-After', RETRY_AFTER_SECONDS)
  })
})
