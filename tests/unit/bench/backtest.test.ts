import { describe, expect, it } from 'vitest'
import { median, runBacktest, summarise } from '../../../bench/backtest'

// Each back-test run replays dozens of simulated tanks through the engine day by day; on a
// loaded machine two runs take longer than vitest's default 5 s, which is not a failure.
describe('forecast back-test', { timeout: 60_000 }, () => {
  const figures = runBacktest(7, 3)
  const rows = summarise(figures)
  const row = (name: string) => rows.find(r => r.name === name)!

  it('is reproducible from a fixed seed', () => {
    expect(runBacktest(7, 3)).toEqual(figures)
    // Another seed draws other tanks.
    expect(runBacktest(8, 3).scenarios.map(s => s.errorsDays)).not.toEqual(figures.scenarios.map(s => s.errorsDays))
  })

  it('covers simulated and synthetic tanks, and the simulated ones are proven by the engine except the stall', () => {
    expect(figures.scenarios.filter(s => s.family === 'simulated').length).toBeGreaterThanOrEqual(4)
    for (const s of figures.scenarios) {
      if (/stall/.test(s.name)) expect(s.proven, s.name).toBe(0)
      else expect(s.proven, s.name).toBe(s.tanks)
    }
  })

  it('gives no range for a stall in either family', () => {
    for (const s of figures.scenarios.filter(x => /stall/.test(x.name))) {
      expect(s.cuts, s.name).toBeGreaterThan(0)
      expect(s.ranges, s.name).toBe(0)
    }
  })

  it('holds the real completion in most ranges when the aquarist doses as the verdict asks', () => {
    const synthetic = row('synthetic: all')
    expect(synthetic.ranges).toBeGreaterThan(20)
    expect(synthetic.hitRate).toBeGreaterThanOrEqual(0.7)
    // Simulated tanks relapse when the first full proof doses meet bacteria sized for smaller
    // feeding doses, which no curve so far can show: the bar is lower, and README says why.
    for (const name of ['simulated: fishless, proof doses from the first zero', 'simulated: fish-in']) {
      expect(row(name).ranges, name).toBeGreaterThan(5)
      expect(row(name).hitRate, name).toBeGreaterThanOrEqual(0.5)
    }
  })

  it('takes the median as the middle value, or the mean of the two middle ones', () => {
    expect(median([3, 1, 2])).toBe(2)
    expect(median([4, 1, 2, 3])).toBe(2.5)
    expect(median([])).toBeNaN()
  })
})
