/**
 * The background worker: on an interval it delivers due mail from the outbox and runs
 * the clocked jobs (alert escalation, test reminders, housekeeping, unused test photos) on the real clock. With
 * NUXT_TEST_HOOKS=1 the clocked jobs run only from POST /api/dev/worker-tick with an
 * injected clock, so tests decide when time has passed; mail delivery still runs.
 */
export default defineNitroPlugin((nitroApp) => {
  const config = useRuntimeConfig()
  const intervalMs = Math.max(200, Number(config.workerIntervalMs) || 5000)
  const clocked = !isOn(config.testHooks)
  let busy = false
  const tick = async () => {
    if (busy) return
    busy = true
    try {
      if (clocked) {
        const now = new Date()
        await runClockedJobs(now)
        await removeExpiredPendingPhotos(now)
      }
      await deliverDueMail()
    }
    catch (error) {
      console.error('Tidewright worker:', error instanceof Error ? error.message : error)
    }
    finally {
      busy = false
    }
  }
  const timer = setInterval(tick, intervalMs)
  timer.unref()
  nitroApp.hooks.hook('close', () => clearInterval(timer))
})
