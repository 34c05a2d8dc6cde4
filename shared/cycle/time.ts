/**
 * Time arithmetic on epoch milliseconds. The engine never reads the clock: every
 * instant comes from the input, so a verdict can be reproduced later.
 */

export const HOUR_MS = 3_600_000
export const DAY_MS = 24 * HOUR_MS

/** Epoch milliseconds of an ISO 8601 string, or NaN when it does not parse. */
export function parseTime(iso: string): number {
  return typeof iso === 'string' ? Date.parse(iso) : Number.NaN
}

/** Epoch milliseconds of a required ISO time; throws a RangeError naming the field when it does not parse. */
export function requireTime(name: string, iso: string): number {
  const ms = parseTime(iso)
  if (!Number.isFinite(ms)) throw new RangeError(`${name} must be an ISO 8601 time (got ${String(iso)})`)
  return ms
}

/** Canonical ISO string (UTC, milliseconds) for epoch milliseconds. */
export function toIso(ms: number): string {
  return new Date(ms).toISOString()
}

/** "2026-03-14 08:00 UTC": unambiguous in a message whatever the reader's time zone. */
export function formatWhen(ms: number): string {
  return `${toIso(ms).slice(0, 16).replace('T', ' ')} UTC`
}

/** "2026-03-14". */
export function formatDate(ms: number): string {
  return toIso(ms).slice(0, 10)
}

/** A duration in words: hours below two days, days above. */
export function formatDuration(ms: number): string {
  const hours = ms / HOUR_MS
  if (hours < 48) return `${Math.round(hours)} h`
  const days = Math.round((hours / 24) * 10) / 10
  return `${days} days`
}
