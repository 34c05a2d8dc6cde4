/** A URL query as the router gives it, and as it takes one back (undefined drops a key). */
type LocationQuery = Record<string, string | null | (string | null)[] | undefined>
type LocationQueryRaw = Record<string, string | null | (string | null)[] | undefined>

/** A list's filters and their defaults: text, a whole number from 1 (the page) or a yes/no. */
export type FilterValue = string | number | boolean
export type FilterDefaults = Record<string, FilterValue>
/** The filter values, typed like their defaults (`page: 1` gives a number). */
export type FilterValues<T extends FilterDefaults> = { [K in keyof T]: T[K] extends number ? number : T[K] extends boolean ? boolean : string }

/** Reads one query value as the type of its default; a missing or unreadable value is the default. */
function readValue(raw: unknown, fallback: FilterValue): FilterValue {
  const text = Array.isArray(raw) ? raw[0] : raw
  if (typeof text !== 'string') return fallback
  if (typeof fallback === 'number') {
    const n = Number(text)
    return Number.isInteger(n) && n >= 1 && text.trim() !== '' ? n : fallback
  }
  if (typeof fallback === 'boolean') return text === 'true' ? true : text === 'false' ? false : fallback
  return text
}

/** The values a text filter may take (a sort order, a status); anything else in the URL is the default. */
export type FilterChoices<T extends FilterDefaults> = { [K in keyof T]?: readonly string[] }

/** The filters a URL query describes, each falling back to its default. */
export function filtersFromQuery<T extends FilterDefaults>(query: LocationQuery, defaults: T, choices: FilterChoices<T> = {}): FilterValues<T> {
  const out: Record<string, FilterValue> = {}
  for (const [name, fallback] of Object.entries(defaults)) {
    const value = readValue(query[name], fallback)
    const allowed = choices[name]
    out[name] = allowed && !allowed.includes(String(value)) ? fallback : value
  }
  return out as FilterValues<T>
}

/**
 * The URL query for these filters: a filter at its default is left out (so the plain address
 * is the default list), and query keys that are not filters are kept as they were.
 */
export function queryFromFilters<T extends FilterDefaults>(values: FilterValues<T>, defaults: T, current: LocationQuery = {}): LocationQueryRaw {
  const out: LocationQueryRaw = { ...current }
  for (const [name, fallback] of Object.entries(defaults)) {
    const value = (values as Record<string, FilterValue>)[name]
    out[name] = value === fallback ? undefined : String(value)
  }
  for (const name of Object.keys(out)) if (out[name] === undefined) delete out[name]
  return out
}

/** Whether any filter other than the page changed: the list then starts again at page 1. */
export function narrowingChanged(before: Record<string, FilterValue>, after: Record<string, FilterValue>, pageKey = 'page'): boolean {
  return Object.keys(after).some(name => name !== pageKey && before[name] !== after[name])
}
