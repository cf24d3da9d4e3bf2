// Move priorities for the planner: a binary min-heap keyed by priority, and priority inheritance
// along the precedence graph (a move that must come first takes over the priority it holds up),
// computed by zero-weight label correcting in increasing key order (Dijkstra 1959 with ties).

export class KeyHeap {
  private k: number[] = []
  private v: number[] = []
  get size() { return this.k.length }
  get topKey(): number { return this.k[0]! }
  push(key: number, val: number) {
    const k = this.k, v = this.v
    let i = k.length
    k.push(key); v.push(val)
    while (i > 0) {
      const p = (i - 1) >> 1
      if (k[p]! <= key) break
      k[i] = k[p]!; v[i] = v[p]!; i = p
    }
    k[i] = key; v[i] = val
  }

  pop(): number {
    const k = this.k, v = this.v
    const top = v[0]!, lk = k.pop()!, lv = v.pop()!
    const n = k.length
    if (n > 0) {
      let i = 0
      for (;;) {
        let c = 2 * i + 1
        if (c >= n) break
        if (c + 1 < n && k[c + 1]! < k[c]!) c++
        if (k[c]! >= lk) break
        k[i] = k[c]!; v[i] = v[c]!; i = c
      }
      k[i] = lk; v[i] = lv
    }
    return top
  }
}

/**
 * A move that must precede another takes over its priority if that is higher (smaller key): the
 * atoms in the way of an inner move, and the moves that must pass a site before it is filled, go
 * with the band they hold up. Zero-weight label correcting in increasing key order.
 */
export function inheritPriority(key: Float64Array, succA: number[][], succB: number[][]): void {
  const T = key.length
  const preds: number[][] = Array.from({ length: T }, () => [])
  for (let j = 0; j < T; j++) {
    for (const k of succA[j]!) preds[k]!.push(j)
    for (const k of succB[j]!) preds[k]!.push(j)
  }
  const heap = new KeyHeap()
  for (let k = 0; k < T; k++) heap.push(key[k]!, k)
  const done = new Uint8Array(T)
  while (heap.size > 0) {
    const x = heap.pop()
    if (done[x]) continue
    done[x] = 1
    for (const p of preds[x]!) {
      if (!done[p] && key[x]! < key[p]!) { key[p] = key[x]!; heap.push(key[p]!, p) }
    }
  }
}
