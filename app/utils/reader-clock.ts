import { formatDay, formatMoment, formatShortDay, formatStamp } from '#shared/readings/reader-words'

/**
 * Dates and times as the signed-in person reads them, on the company's clock (the me store),
 * never the machine's: the server's page and the hydrated browser print the same text.
 * Call from components (setup, templates, computed values), where the store is at hand.
 */
const onClock = (format: (ms: number, timeZone: string) => string) => (iso: string | null | undefined): string =>
  iso ? format(Date.parse(iso), useMeStore().timeZone) : '—'

/** "Dec 2, 3:01 PM": a test, an alert, a session. */
export const formatTestTime = onClock(formatMoment)
/** "Dec 2, 2026": a day. */
export const formatDate = onClock(formatDay)
/** "Dec 2, 2026, 3:01 PM": a signed or audited moment. */
export const formatDateTime = onClock(formatStamp)
/** A moment given as epoch milliseconds (chart axes and tooltips). */
export const formatMomentMs = (ms: number): string => formatMoment(ms, useMeStore().timeZone)
/** "Dec 2" from epoch milliseconds: chart axes and the first end of a range. */
export const formatShortDayMs = (ms: number): string => formatShortDay(ms, useMeStore().timeZone)
