import type { StageStatus } from '#shared/types/plan'

/** Plain words for a stage's status. */
export const STAGE_STATUS_LABELS: Record<StageStatus, string> = {
  'not-started': 'Not started',
  'in-progress': 'In progress',
  'done': 'Done',
  'skipped': 'Skipped',
}

export const STAGE_STATUS_CLASSES: Record<StageStatus, string> = {
  'not-started': 'bg-sand-100 text-ink-soft',
  'in-progress': 'bg-tide-100 text-tide-700',
  'done': 'bg-signal-safe/15 text-signal-safe',
  'skipped': 'bg-sand-200 text-ink-soft',
}
