/**
 * Remembers a pure function's last results by a key made from its arguments, so
 * that pages repeat no interval computation (t and beta quantiles cost a fraction
 * of a millisecond each) while the sums they come from are unchanged. Keys are the
 * values themselves, so a changed row can never be served an old figure.
 */
export function memoize<Args extends unknown[], Result>(fn: (...args: Args) => Result, size = 20_000): (...args: Args) => Result {
  const cache = new Map<string, Result>();
  return (...args: Args) => {
    const key = JSON.stringify(args);
    const hit = cache.get(key);
    if (hit !== undefined || cache.has(key)) return hit as Result;
    const result = fn(...args);
    if (cache.size >= size) cache.delete(cache.keys().next().value as string);
    cache.set(key, result);
    return result;
  };
}
