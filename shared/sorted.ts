/**
 * Binary search over a list kept in order. Framework-free: the rule engine, its prepared
 * history and the server's kept engine input all place and find tests with it.
 */

/**
 * The index of the first item of `list` for which `before` is false, for a `before` that holds
 * for a leading run of the list and then never again (true for everything that comes before
 * the point sought): `list.length` when it holds for every item. log2(n) calls of `before`.
 */
export function partitionPoint<T>(list: readonly T[], before: (item: T) => boolean): number {
  let low = 0
  let high = list.length
  while (low < high) {
    const middle = (low + high) >>> 1
    if (before(list[middle]!)) low = middle + 1
    else high = middle
  }
  return low
}
