/**
 * The tanks' engine inputs a database handle keeps between verdict refreshes
 * (engine-input-cache.ts), least recently used first out. Bounded by the tests they hold in
 * memory (`held`) as well as by how many tanks: a year of a client's daily tests is some hundreds of kB, but an
 * imported history of 100,000 tests is tens of MB, and a worker thread that refreshed a few
 * such tanks must not keep them all. A tank larger than the bound is kept alone.
 */

export interface KeptTanksBounds {
  maxTanks: number
  maxReadings: number
}

export class KeptTanks<Rows extends { readonly held: number }> {
  private readonly byTank = new Map<string, Rows>()
  private held = 0

  constructor(private readonly bounds: KeptTanksBounds) {}

  /** Tests held by every kept copy together. */
  get readingCount(): number {
    return this.held
  }

  /** The tank's copy, now the most recently used; undefined when none is kept. */
  get(tankId: string): Rows | undefined {
    const rows = this.byTank.get(tankId)
    if (rows) this.keep(tankId, rows)
    return rows
  }

  /** Keeps `rows` as the tank's copy (the most recently used), letting the oldest go while a bound is passed. */
  keep(tankId: string, rows: Rows): void {
    this.drop(tankId)
    this.byTank.set(tankId, rows)
    this.held += rows.held
    while (this.byTank.size > 1 && (this.byTank.size > this.bounds.maxTanks || this.held > this.bounds.maxReadings)) {
      this.drop(this.byTank.keys().next().value!)
    }
  }

  drop(tankId: string): void {
    const rows = this.byTank.get(tankId)
    if (!rows) return
    this.byTank.delete(tankId)
    this.held -= rows.held
  }
}
