import { describe, expect, it } from 'vitest'
import { STAGE_STATUSES } from '../../../../shared/vocabulary'
import { STAGE_MOVES } from '../../../../app/utils/stage-labels'

describe('STAGE_MOVES', () => {
  it('offers start and finish on a stage not yet started', () => {
    expect(STAGE_MOVES['not-started'].map(m => m.label)).toEqual(['Start stage', 'Mark stage done'])
  })

  it('offers only finishing on a stage in progress', () => {
    expect(STAGE_MOVES['in-progress'].map(m => m.to)).toEqual(['done'])
  })

  it('offers only reopening, as the quiet button, on a finished or skipped stage', () => {
    for (const status of ['done', 'skipped'] as const) {
      expect(STAGE_MOVES[status]).toEqual([{ to: 'in-progress', label: 'Reopen', primary: false }])
    }
  })

  it('never offers a move to the status the stage already has, nor back to not started', () => {
    for (const status of STAGE_STATUSES) {
      for (const move of STAGE_MOVES[status]) {
        expect(move.to).not.toBe(status)
        expect(move.to).not.toBe('not-started')
      }
    }
  })
})
