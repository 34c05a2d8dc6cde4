/**
 * The charts' one palette, read from the Tailwind theme so a chart and the page around it
 * never disagree: one colour per series in every chart, the signal colours kept for
 * thresholds (danger, caution, safe), and quiet theme tints for phases and markers.
 */
import theme from '../../tailwind.config'

const colors = theme.theme.extend.colors

export type SeriesKey = keyof typeof colors.series

/** The colour of each measured series, the same in the tank charts and the evidence chart. */
export const SERIES_COLOURS: Readonly<Record<SeriesKey, string>> = Object.freeze({ ...colors.series })

/** Threshold meaning only; never a series. */
export const SIGNAL_COLOURS = Object.freeze({ ...colors.signal })

/** Axis text, gridlines, event markers and the label backdrop. */
export const CHART_INK = Object.freeze({ text: colors.ink.faint, soft: colors.ink.soft, grid: colors.sand[200], backdrop: colors.sand[50] })

/** A theme colour (#rrggbb) at the given opacity, for bands and spans drawn under the data. */
export function tint(hex: string, alpha: number): string {
  const n = Number.parseInt(hex.slice(1), 16)
  return `rgba(${(n >> 16) & 255},${(n >> 8) & 255},${n & 255},${alpha})`
}

/** The cycle phases as shaded spans: sand while ammonia clears, tide tints after, safe green once complete. */
export const PHASE_TINTS = Object.freeze({
  'not-started': 'rgba(0,0,0,0)',
  'ammonia': tint(colors.sand[300], 0.35),
  'nitrite': tint(colors.tide[300], 0.2),
  'settling': tint(colors.tide[100], 0.55),
  'complete': tint(colors.signal.safe, 0.1),
})
