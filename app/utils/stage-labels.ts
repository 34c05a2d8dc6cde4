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

/** A status button on a stage card: the status it moves the stage to, its words, and whether it is the main way on. */
export interface StageMove { to: StageStatus, label: string, primary: boolean }

const START: StageMove = { to: 'in-progress', label: 'Start stage', primary: true }
const FINISH: StageMove = { to: 'done', label: 'Mark stage done', primary: true }
const REOPEN: StageMove = { to: 'in-progress', label: 'Reopen', primary: false }

/** The status buttons a stage card offers from each status, in the order they show (skipping asks for a reason and is offered apart). */
export const STAGE_MOVES: Record<StageStatus, readonly StageMove[]> = {
  'not-started': [START, FINISH],
  'in-progress': [FINISH],
  'done': [REOPEN],
  'skipped': [REOPEN],
}
