/**
 * Merges the actions the rules propose into one short, ordered to-do list: one
 * water change (the largest asked for covers the others), one re-test (the
 * earliest), and no duplicates.
 */

import type { CycleAction } from './types'

/** Every kind of action the rules propose, most urgent first (unknown kinds go last, alphabetically). */
export const ACTION_KINDS: readonly string[] = ['water-change', 'test-now', 'retest', 'check-stall', 'lower-dose', 'dose-ammonia', 'clearance-test', 'test-nitrate', 'start-cycle']
const ORDER = ACTION_KINDS

function rank(kind: string): number {
  const index = ORDER.indexOf(kind)
  return index === -1 ? ORDER.length : index
}

function compareStrings(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0
}

function better(kept: CycleAction, next: CycleAction): CycleAction {
  if (kept.kind === 'water-change') return (next.waterChangePercent ?? 0) > (kept.waterChangePercent ?? 0) ? next : kept
  // For a re-test, the earliest time is the one that matters.
  return compareStrings(next.dueBy ?? '~', kept.dueBy ?? '~') < 0 ? next : kept
}

function tie(a: CycleAction, b: CycleAction): number {
  return compareStrings(a.dueBy ?? '', b.dueBy ?? '') || compareStrings(a.message, b.message) || (a.waterChangePercent ?? 0) - (b.waterChangePercent ?? 0)
}

/** One action per kind for water changes and re-tests, exact duplicates dropped, in a fixed order. */
export function mergeActions(actions: readonly CycleAction[]): CycleAction[] {
  const sorted = [...actions].sort((a, b) => compareStrings(a.kind, b.kind) || tie(a, b))
  const single = new Map<string, CycleAction>()
  const rest = new Map<string, CycleAction>()
  for (const action of sorted) {
    if (action.kind === 'water-change' || action.kind === 'retest') {
      const kept = single.get(action.kind)
      single.set(action.kind, kept ? better(kept, action) : action)
    }
    else {
      rest.set(`${action.kind}\u0000${action.message}\u0000${action.dueBy ?? ''}`, action)
    }
  }
  return [...single.values(), ...rest.values()].sort((a, b) => rank(a.kind) - rank(b.kind) || compareStrings(a.kind, b.kind) || tie(a, b))
}
