// Spatial hash for neighbour queries: items in square cells, kept as singly linked lists in typed
// arrays (no allocation per item); forNear visits the 3 × 3 cells around a point.

export class BucketGrid {
  private readonly head: Int32Array
  private next = new Int32Array(1024)
  private readonly cols: number
  private readonly rows: number

  /** cols × rows cells; positions are given in cell units. */
  constructor(cols: number, rows: number) {
    this.cols = Math.max(1, Math.ceil(cols) + 1)
    this.rows = Math.max(1, Math.ceil(rows) + 1)
    this.head = new Int32Array(this.cols * this.rows).fill(-1)
  }

  add(item: number, cx: number, cy: number) {
    if (item >= this.next.length) {
      const grown = new Int32Array(Math.max(item + 1, 2 * this.next.length))
      grown.set(this.next)
      this.next = grown
    }
    const k = this.key(cx, cy)
    this.next[item] = this.head[k]!
    this.head[k] = item
  }

  /** Calls visit for every item in the cell of (cx, cy) and its eight neighbours; stops early when visit returns true. */
  forNear(cx: number, cy: number, visit: (item: number) => boolean): void {
    const qx = Math.min(this.cols - 1, Math.max(0, Math.floor(cx)))
    const qy = Math.min(this.rows - 1, Math.max(0, Math.floor(cy)))
    for (let j = Math.max(0, qy - 1); j <= Math.min(this.rows - 1, qy + 1); j++) {
      for (let q = Math.max(0, qx - 1); q <= Math.min(this.cols - 1, qx + 1); q++) {
        for (let m = this.head[j * this.cols + q]!; m >= 0; m = this.next[m]!) if (visit(m)) return
      }
    }
  }

  /** First item of cell (q, j), or −1 (also outside the grid); walk on with after(). */
  first(q: number, j: number): number {
    return q < 0 || j < 0 || q >= this.cols || j >= this.rows ? -1 : this.head[j * this.cols + q]!
  }

  after(item: number): number {
    return this.next[item]!
  }

  private key(cx: number, cy: number): number {
    const q = Math.min(this.cols - 1, Math.max(0, Math.floor(cx)))
    const j = Math.min(this.rows - 1, Math.max(0, Math.floor(cy)))
    return j * this.cols + q
  }
}
