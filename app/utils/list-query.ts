import type { FilterValue } from '~/utils/query-filters'

/** The page size of the staff list pages (people, clients, tanks). */
export const LIST_PAGE_SIZE = 20

/**
 * The API query for one page of a filtered list: each filter that is set, as text (an empty text
 * filter is left out, so the route applies no such filter), then the page size. Booleans and the
 * page number go as their text, because a URL query carries only text.
 */
export function listQuery(filters: Readonly<Record<string, FilterValue>>, pageSize = LIST_PAGE_SIZE): Record<string, string> {
  const out: Record<string, string> = {}
  for (const [name, value] of Object.entries(filters)) if (value !== '') out[name] = String(value)
  out.pageSize = String(pageSize)
  return out
}
