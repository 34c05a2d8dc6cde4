/**
 * Number formatting for messages. Clients read kits "as ion" or "as nitrogen", so
 * every concentration in a message says which basis it is on.
 */

/** Rounds for display: two significant decimals below 1, one above. */
export function formatNumber(value: number): string {
  const rounded = Math.abs(value) < 1 ? Math.round(value * 100) / 100 : Math.round(value * 10) / 10
  return String(rounded)
}

/** "0.41 mg/L as N". */
export function mgN(value: number): string {
  return `${formatNumber(value)} mg/L as N`
}

/** A whole-number percent for water changes; a partial percent is not something anyone can measure out. */
export function formatPercent(value: number): string {
  return `${Math.ceil(value)} %`
}
