import * as v from 'valibot'

const TickSchema = v.object({
  now: v.optional(v.pipe(v.string(), v.isoTimestamp('Give the time as an ISO timestamp.'))),
})

/**
 * POST /api/dev/worker-tick — tests only (NUXT_TEST_HOOKS=1, otherwise 404): runs the
 * worker once at an injected time `now` — escalations, reminders, weekly digests, housekeeping,
 * unused test photos, then mail delivery. Returns { escalated, reminded, aquaristsTold, digests, photosRemoved, sent, failed }.
 */
export default defineEventHandler(async (event) => {
  requireSwitch(useRuntimeConfig().testHooks)
  const { now } = await readValidatedBody(event, valid(TickSchema))
  const at = now ? new Date(now) : new Date()
  const jobs = await runClockedJobs(at)
  const photosRemoved = await removeExpiredPendingPhotos(at)
  const mail = await deliverDueMail(new Date(Math.max(at.getTime(), Date.now())))
  return { ...jobs, photosRemoved, ...mail }
})
