import type { LivestockGroup, Severity } from '#shared/cycle/types'

/** Plain words for each livestock group. */
export const GROUP_LABELS: Record<LivestockGroup, string> = {
  'fish': 'Fish',
  'invertebrates': 'Invertebrates (snails, crabs, shrimp)',
  'soft-coral': 'Soft corals',
  'lps-coral': 'LPS corals',
  'sps-coral': 'SPS corals',
}

/** Words and colours for a finding's severity (signal colours mean water quality only). */
export const SEVERITY_STYLE: Record<Severity, { label: string, classes: string }> = {
  info: { label: 'Note', classes: 'border-signal-info text-signal-info' },
  caution: { label: 'Caution', classes: 'border-signal-caution text-signal-caution' },
  danger: { label: 'Act now', classes: 'border-signal-danger text-signal-danger' },
}
