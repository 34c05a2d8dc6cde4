import type { VerdictView } from '#shared/types/readings'
import { tankDataKeys } from '~/utils/data-keys'

/** A tank's verdict (GET /api/tanks/:id/verdict) under its stable key: the danger block and the verdict panel read one fetch. */
export function useTankVerdict(tankId: MaybeRefOrGetter<string>) {
  return useFetch<VerdictView>(() => `/api/tanks/${toValue(tankId)}/verdict`, { key: () => tankDataKeys.verdict(toValue(tankId)) })
}
