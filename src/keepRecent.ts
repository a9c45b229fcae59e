/**
 * Puts `key` in `map` as its most recently used entry and drops the least recently used beyond
 * `maxEntries` (none kept when it is 0). A Map iterates in insertion order, so re-inserting on
 * every use keeps its first key the least recently used.
 */
export function keepRecent<K, V>(map: Map<K, V>, key: K, value: V, maxEntries: number): void {
  map.delete(key);
  map.set(key, value);
  if (map.size > maxEntries) map.delete(map.keys().next().value as K);
}
