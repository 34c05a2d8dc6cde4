import { filtersFromQuery, narrowingChanged, queryFromFilters, type FilterChoices, type FilterDefaults, type FilterValues } from '~/utils/query-filters'

/**
 * A list's filters kept in the URL query, so Back, a reload and a shared link all show the same
 * list. `choices` names the values a text filter may take. Returns one reactive object of filter values typed like their defaults; changing one
 * replaces the current history entry's query (no entry per keystroke), and changing anything
 * but `page` goes back to page 1. Values at their default stay out of the URL.
 */
export function useQueryFilters<T extends FilterDefaults>(defaults: T, choices: FilterChoices<T> = {}) {
  const route = useRoute()
  const router = useRouter()
  const filters = reactive(filtersFromQuery(route.query, defaults, choices)) as FilterValues<T>

  // Back and forward (or a link to the same page with other filters) bring the URL's values in.
  watch(() => route.query, (query) => {
    const next = filtersFromQuery(query, defaults, choices)
    for (const name of Object.keys(next) as (keyof T)[]) {
      if (filters[name] !== next[name]) filters[name] = next[name]
    }
  })

  watch(() => ({ ...filters }), (after, before) => {
    const inUrl = filtersFromQuery(route.query, defaults, choices)
    if (Object.keys(defaults).every(name => after[name] === inUrl[name])) return // the URL says this already (Back)
    if ('page' in defaults && narrowingChanged(before, after) && filters.page !== defaults.page) {
      (filters as Record<string, unknown>).page = defaults.page
      return // the page change runs this watcher again
    }
    void router.replace({ query: queryFromFilters(filters, defaults, route.query) })
  })

  return filters
}
