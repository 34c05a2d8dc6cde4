/**
 * The copies of tanks' histories kept between verdict refreshes are bounded by the tests they
 * hold, not only by how many tanks: one tank with years of imported tests weighs as much as
 * hundreds of ordinary ones, and a worker thread that refreshed a few of them must not keep them all.
 */
import { describe, expect, it } from 'vitest'
import { KeptTanks } from '../../../../../server/domain/readings/kept-tanks'

/** A kept copy holding `n` tests in memory (only their count matters here). */
const copyOf = (n: number) => ({ revision: 1, held: n })

describe('the kept copies', () => {
  it('let the least recently used tanks go when the tests they hold pass the bound', () => {
    const kept = new KeptTanks({ maxTanks: 10, maxReadings: 100 })
    kept.keep('a', copyOf(40))
    kept.keep('b', copyOf(40))
    expect(kept.get('a')).toBeDefined() // a is now the most recently used
    kept.keep('c', copyOf(40))
    expect(kept.get('b')).toBeUndefined()
    expect(kept.get('a')?.held).toBe(40)
    expect(kept.get('c')?.held).toBe(40)
    expect(kept.readingCount).toBe(80)
  })

  it('let the least recently used go past the number of tanks', () => {
    const kept = new KeptTanks({ maxTanks: 2, maxReadings: 1000 })
    kept.keep('a', copyOf(1))
    kept.keep('b', copyOf(1))
    kept.keep('c', copyOf(1))
    expect(kept.get('a')).toBeUndefined()
    expect(kept.readingCount).toBe(2)
  })

  it('keep a tank larger than the bound alone, and count a replaced copy once', () => {
    const kept = new KeptTanks({ maxTanks: 10, maxReadings: 100 })
    kept.keep('a', copyOf(30))
    kept.keep('big', copyOf(150))
    expect(kept.get('a')).toBeUndefined()
    expect(kept.get('big')?.held).toBe(150)
    kept.keep('big', copyOf(20))
    kept.keep('a', copyOf(30))
    expect(kept.readingCount).toBe(50)
    kept.drop('big')
    expect(kept.readingCount).toBe(30)
  })
})
