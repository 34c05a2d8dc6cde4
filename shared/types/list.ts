/**
 * The one envelope of every list the API answers: the rows under `items`, never a bare
 * array, so a list can gain a count or a page without breaking its callers.
 * tests/api/handler-contract.test.ts fails for a GET route that answers a bare array.
 */
export interface ListOf<T> {
  items: T[]
}

/** A list served a page at a time: this page's rows, how many there are in all, the page and its size. */
export interface PageOf<T> extends ListOf<T> {
  total: number
  page: number
  pageSize: number
}
