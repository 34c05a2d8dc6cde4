/**
 * Screens at least this wide (Tailwind's `sm`) show all three tank charts at once, close below
 * the verdict: there the charts' data and code are fetched with the page. Narrower screens fetch
 * them only when the reader comes near the charts.
 */
export const CHARTS_WIDE_SCREEN = '(min-width: 640px)'
