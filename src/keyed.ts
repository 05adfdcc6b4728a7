// Objects keyed by names the user chose (probes, lines, route items, checks): created without a
// prototype, so that a probe named "__proto__", "constructor" or "toString" is stored and written like
// any other name instead of reaching Object.prototype.

/** An empty object for user-chosen keys; JSON.stringify writes every key, "__proto__" included. */
export function keyedRecord<T>(): Record<string, T> {
  return Object.create(null) as Record<string, T>;
}
