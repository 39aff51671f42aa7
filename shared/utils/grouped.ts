/** Items by a key, each group in the items' order: one pass instead of one filter per group (Map.groupBy needs Node.js 21). */
export function groupedBy<T, K>(items: readonly T[], key: (item: T) => K): Map<K, T[]> {
  const out = new Map<K, T[]>()
  for (const item of items) {
    const k = key(item)
    const list = out.get(k)
    if (list) list.push(item)
    else out.set(k, [item])
  }
  return out
}
