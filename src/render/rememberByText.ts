/**
 * A pure function of two texts, with its results remembered: a lookup formats the same few dozen
 * hours for every channel that asks, and building dates in a zone is most of a message's cost.
 * Cleared when full (the inputs come from forecasts and zone names, so they are not bounded).
 * Results are shared between callers: they must be treated as read-only.
 */
export function rememberByText<T>(compute: (first: string, second: string) => T, maxEntries = 4096): (first: string, second: string) => T {
  const results = new Map<string, T>();
  return (first, second) => {
    // NUL cannot occur in an ISO time or a zone name, so the joined key is unambiguous.
    const key = `${first}\u0000${second}`;
    const known = results.get(key);
    if (known !== undefined || results.has(key)) return known as T;
    const result = compute(first, second);
    if (results.size >= maxEntries) results.clear();
    results.set(key, result);
    return result;
  };
}
