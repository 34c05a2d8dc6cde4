import type { TankList } from '#shared/types/tanks'

/** The signed-in user's tanks, one page at a time, from GET /api/tanks. */
export function useTankList(query: MaybeRefOrGetter<Record<string, string | undefined>> = {}) {
  return useFetch<TankList>('/api/tanks', {
    key: 'tank-list',
    query,
  })
}
