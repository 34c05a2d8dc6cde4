/**
 * The text of a list's search box, written to one filter of `useQueryFilters` a moment after
 * typing stops (one request, one URL change), and refilled when Back brings another search in.
 */
export function useSearchFilter<K extends string>(filters: Record<K, string>, name: K, delayMs = 300) {
  const text = ref(filters[name])
  watch(refDebounced(text, delayMs), (value) => { filters[name] = value })
  watch(() => filters[name], (value) => { if (value !== text.value) text.value = value })
  return text
}
