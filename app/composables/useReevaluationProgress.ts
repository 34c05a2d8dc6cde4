import type { ReevaluationProgress } from '#shared/types/settings'

const POLL_MS = 1000

/** The line the settings page shows for a re-evaluation: under way, or done with its outcome. */
export function reevaluationLine(progress: ReevaluationProgress): string {
  const { total, done, phaseChanged } = progress
  if (done < total) return `Re-evaluating tanks: ${done} of ${total}`
  return `${total} ${total === 1 ? 'tank' : 'tanks'} re-evaluated, ${phaseChanged} changed cycle phase.`
}

/**
 * Follows the re-evaluation a threshold change started (the server works through the
 * company's tanks in batches): asks for progress every second until every tank is done.
 * On opening the page it picks up one still under way, say after another admin's save.
 */
export function useReevaluationProgress() {
  const progress = ref<ReevaluationProgress | null>(null)
  let timer: ReturnType<typeof setTimeout> | undefined

  async function poll() {
    timer = undefined
    try {
      progress.value = await $fetch<ReevaluationProgress>('/api/settings/reevaluation')
    }
    catch {
      // A lost answer is asked again on the next tick; the line keeps the last count meanwhile.
    }
    schedule()
  }
  function schedule() {
    if (timer || !progress.value || progress.value.done >= progress.value.total) return
    timer = setTimeout(poll, POLL_MS)
  }
  /** Starts following from the count the save answered with. */
  function follow(start: ReevaluationProgress | null) {
    progress.value = start
    schedule()
  }

  onMounted(async () => {
    const now = await $fetch<ReevaluationProgress>('/api/settings/reevaluation').catch(() => null)
    if (now && now.done < now.total && !progress.value) follow(now)
  })
  onBeforeUnmount(() => clearTimeout(timer))

  const line = computed(() => (progress.value && progress.value.total ? reevaluationLine(progress.value) : ''))
  const running = computed(() => !!progress.value && progress.value.done < progress.value.total)
  return { progress, line, running, follow }
}
