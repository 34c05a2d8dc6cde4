import { describe, expect, it } from 'vitest'
import { STATUS_MARKS } from '~/utils/status-marks'
import { ALERT_STATUS_LOOKS, PERSON_STATUS_LOOKS, TANK_STATUS_LOOKS } from '~/utils/status-looks'

const LOOK_SETS = { tank: TANK_STATUS_LOOKS, person: PERSON_STATUS_LOOKS, alert: ALERT_STATUS_LOOKS }

describe('STATUS_MARKS', () => {
  it('draws every shape a status look names with at least one element', () => {
    for (const looks of Object.values(LOOK_SETS)) {
      for (const look of Object.values(looks)) expect(STATUS_MARKS[look.shape].length).toBeGreaterThan(0)
    }
  })

  it('never draws two shapes alike, so a shape alone tells statuses apart (WCAG 1.4.1)', () => {
    const drawings = Object.values(STATUS_MARKS).map(parts => JSON.stringify(parts))
    expect(new Set(drawings).size).toBe(drawings.length)
  })

  it('keeps every mark inside the 10 by 10 box the pill draws in', () => {
    for (const parts of Object.values(STATUS_MARKS)) {
      for (const { attrs } of parts) {
        const numbers = [attrs.d, attrs.x, attrs.y, attrs.cx, attrs.cy]
          .filter((v): v is string => v !== undefined)
          .flatMap(v => v.match(/\d+(\.\d+)?/g) ?? [])
          .map(Number)
        for (const n of numbers) expect(n).toBeLessThanOrEqual(10)
      }
    }
  })

  it('fills the half shape on top of the same ring the ring shape draws', () => {
    expect(STATUS_MARKS.half[0]).toEqual(STATUS_MARKS.ring[0])
    expect(STATUS_MARKS.half).toHaveLength(2)
  })
})
