// Binary search over values in ascending order (strings, numbers, typed arrays).

/** The first position in ascending `values` whose value is not before `key` (values.length when none). */
export function lowerBound<T extends string | number>(values: ArrayLike<T>, key: T): number {
  let lo = 0;
  let hi = values.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (values[mid]! < key) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
