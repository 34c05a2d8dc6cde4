import { describe, expect, it } from 'vitest'
import { median, runBacktest, summarise } from '../../../bench/backtest'

describe('forecast back-test', () => {
  const figures = runBacktest(7, 3)

  it('is reproducible from a fixed seed', () => {
    expect(runBacktest(7, 3)).toEqual(figures)
    // Another seed draws other tanks.
    expect(runBacktest(8, 3).scenarios.map(s => s.errorsDays)).not.toEqual(figures.scenarios.map(s => s.errorsDays))
  })

  it('holds the real completion in most ranges and gives no range for a stall', () => {
    const all = summarise(figures).find(r => r.name === 'all')!
    expect(all.ranges).toBeGreaterThan(20)
    expect(all.hitRate).toBeGreaterThanOrEqual(0.7)
    const stall = figures.scenarios.find(s => s.name === 'stall')!
    expect(stall.cuts).toBeGreaterThan(0)
    expect(stall.ranges).toBe(0)
  })

  it('takes the median as the middle value, or the mean of the two middle ones', () => {
    expect(median([3, 1, 2])).toBe(2)
    expect(median([4, 1, 2, 3])).toBe(2.5)
    expect(median([])).toBeNaN()
  })
})
