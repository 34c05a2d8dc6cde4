import { staleCompanyTanks } from '#server/domain/settings/reevaluation'

/** Companies whose batches are under way in this process: one chain of batches each. */
const running = new Set<string>()

/**
 * Re-evaluates the company's stale verdicts one bounded batch at a time, yielding to other
 * requests between batches, so a company with many tanks neither holds up the save nor the
 * server. Each tank goes through `onTankDataChanged`, so alerts open and resolve as after a
 * new reading. What a restart interrupts is finished by the next read of progress, of a
 * tank, or by the worker's verdict round: the stale marks are in the database.
 */
export function reevaluateCompanyInBatches(organisationId: string): void {
  if (running.has(organisationId)) return
  running.add(organisationId)
  const step = async () => {
    try {
      const batch = staleCompanyTanks(useDB(), organisationId)
      if (!batch.length) {
        running.delete(organisationId)
        return
      }
      const now = new Date()
      for (const tankId of batch) await onTankDataChanged(tankId, { now })
      setTimeout(step, 0)
    }
    catch (error) {
      running.delete(organisationId)
      console.error('Tidewright re-evaluation:', error instanceof Error ? error.message : error)
    }
  }
  setTimeout(step, 0)
}
