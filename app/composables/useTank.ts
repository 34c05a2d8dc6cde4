import type { TankView } from '#shared/types/tanks'
import { tankDataKeys } from '~/utils/data-keys'

/** One tank (GET /api/tanks/:id) under its stable key, shared by every page and component that shows it. */
export function useTank(tankId: MaybeRefOrGetter<string>) {
  return useFetch<TankView>(() => `/api/tanks/${toValue(tankId)}`, { key: () => tankDataKeys.tank(toValue(tankId)) })
}
