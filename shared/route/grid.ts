// Uniform-grid (cell-list) spatial index over movable points: corridor queries along a segment,
// radius queries, and k-nearest neighbours by expanding square rings of cells.
// Kept inside shared/route on purpose (no dependency on other modules' work in progress).

export interface Bounds { xmin: number, xmax: number, ymin: number, ymax: number }

const MAX_CELLS = 1 << 22

export function boundsOf(...sets: Array<ArrayLike<readonly [number, number]> | undefined>): Bounds {
  let xmin = Infinity, xmax = -Infinity, ymin = Infinity, ymax = -Infinity
  for (const set of sets) {
    if (!set) continue
    for (let i = 0; i < set.length; i++) {
      const p = set[i]!
      if (p[0] < xmin) xmin = p[0]
      if (p[0] > xmax) xmax = p[0]
      if (p[1] < ymin) ymin = p[1]
      if (p[1] > ymax) ymax = p[1]
    }
  }
  if (!(xmin <= xmax)) return { xmin: 0, xmax: 1, ymin: 0, ymax: 1 }
  return { xmin, xmax, ymin, ymax }
}

export class PointGrid {
  readonly cell: number
  readonly x0: number
  readonly y0: number
  readonly nx: number
  readonly ny: number
  readonly xs: Float64Array
  readonly ys: Float64Array
  private readonly cells: number[][]
  private readonly where: Int32Array
  size = 0

  constructor(b: Bounds, cell_nm: number, capacity: number) {
    const w = Math.max(b.xmax - b.xmin, 1e-9), h = Math.max(b.ymax - b.ymin, 1e-9)
    let cell = Math.max(cell_nm, 1e-6)
    while (Math.ceil(w / cell) * Math.ceil(h / cell) > MAX_CELLS) cell *= 1.5
    this.cell = cell
    this.x0 = b.xmin
    this.y0 = b.ymin
    this.nx = Math.max(1, Math.ceil(w / cell))
    this.ny = Math.max(1, Math.ceil(h / cell))
    this.cells = Array.from({ length: this.nx * this.ny }, () => [])
    this.xs = new Float64Array(capacity)
    this.ys = new Float64Array(capacity)
    this.where = new Int32Array(capacity).fill(-1)
  }

  // Points outside the bounds go into the border cells; queries clamp the same way, so they stay
  // supersets of the true answer.
  cx(x: number): number {
    const c = Math.floor((x - this.x0) / this.cell)
    return c < 0 ? 0 : c >= this.nx ? this.nx - 1 : c
  }

  cy(y: number): number {
    const c = Math.floor((y - this.y0) / this.cell)
    return c < 0 ? 0 : c >= this.ny ? this.ny - 1 : c
  }

  /** The ids in cell (cx, cy); do not modify. */
  cellAt(cx: number, cy: number): readonly number[] {
    return this.cells[cy * this.nx + cx]!
  }

  has(id: number): boolean {
    return this.where[id]! >= 0
  }

  insert(id: number, x: number, y: number): void {
    if (this.where[id]! >= 0) this.remove(id)
    const c = this.cy(y) * this.nx + this.cx(x)
    this.cells[c]!.push(id)
    this.where[id] = c
    this.xs[id] = x
    this.ys[id] = y
    this.size++
  }

  remove(id: number): void {
    const c = this.where[id]!
    if (c < 0) return
    const list = this.cells[c]!
    const k = list.indexOf(id)
    list[k] = list[list.length - 1]!
    list.pop()
    this.where[id] = -1
    this.size--
  }

  move(id: number, x: number, y: number): void {
    this.insert(id, x, y)
  }

  /**
   * Calls fn for every point in cells that may lie within r of the segment a–b (a superset).
   * fn may return true to stop the scan early; nearSegment then returns true.
   */
  nearSegment(ax: number, ay: number, bx: number, by: number, r: number, fn: (id: number) => boolean | undefined): boolean {
    const dx = bx - ax, dy = by - ay
    const cy0 = this.cy(Math.min(ay, by) - r), cy1 = this.cy(Math.max(ay, by) + r)
    for (let cy = cy0; cy <= cy1; cy++) {
      // Part of the segment whose y lies in this row band widened by r; its x-extent widened by r.
      const ylo = cy === 0 ? -Infinity : this.y0 + cy * this.cell - r
      const yhi = cy === this.ny - 1 ? Infinity : this.y0 + (cy + 1) * this.cell + r
      let t0 = 0, t1 = 1
      if (Math.abs(dy) < 1e-15) {
        if (ay < ylo || ay > yhi) continue
      }
      else {
        let ta = (ylo - ay) / dy, tb = (yhi - ay) / dy
        if (ta > tb) { const t = ta; ta = tb; tb = t }
        t0 = Math.max(0, ta)
        t1 = Math.min(1, tb)
        if (t0 > t1) continue
      }
      const xa = ax + dx * t0, xb = ax + dx * t1
      const cx0 = this.cx(Math.min(xa, xb) - r), cx1 = this.cx(Math.max(xa, xb) + r)
      const row = cy * this.nx
      for (let cx = cx0; cx <= cx1; cx++) {
        const list = this.cells[row + cx]!
        for (let i = 0; i < list.length; i++) if (fn(list[i]!) === true) return true
      }
    }
    return false
  }

  /** Calls fn for every point within r of (x, y). */
  inRadius(x: number, y: number, r: number, fn: (id: number, d2: number) => void): void {
    const r2 = r * r
    const cx0 = this.cx(x - r), cx1 = this.cx(x + r), cy0 = this.cy(y - r), cy1 = this.cy(y + r)
    for (let cy = cy0; cy <= cy1; cy++) {
      for (let cx = cx0; cx <= cx1; cx++) {
        const list = this.cells[cy * this.nx + cx]!
        for (let i = 0; i < list.length; i++) {
          const id = list[i]!
          const ex = this.xs[id]! - x, ey = this.ys[id]! - y
          const d2 = ex * ex + ey * ey
          if (d2 <= r2) fn(id, d2)
        }
      }
    }
  }

  /**
   * The k nearest points to (x, y) (Euclidean), nearest first, written into ids/d2 (length ≥ k).
   * Returns how many were found. Rings of cells are scanned until the ring's inner distance
   * exceeds the current k-th distance.
   */
  knn(x: number, y: number, k: number, ids: Int32Array, d2s: Float64Array): number {
    let found = 0
    const ccx = this.cx(x), ccy = this.cy(y)
    const maxRing = Math.max(this.nx, this.ny)
    for (let ring = 0; ring <= maxRing; ring++) {
      if (found >= k) {
        // Every point in this ring is at least (ring - 1) cells away in x or y.
        const inner = (ring - 1) * this.cell
        if (inner > 0 && inner * inner > d2s[found - 1]!) break
      }
      const y0 = ccy - ring, y1 = ccy + ring, x0 = ccx - ring, x1 = ccx + ring
      for (let cy = Math.max(0, y0); cy <= Math.min(this.ny - 1, y1); cy++) {
        const edgeRow = cy === y0 || cy === y1
        for (let cx = Math.max(0, x0); cx <= Math.min(this.nx - 1, x1); cx++) {
          if (!edgeRow && cx !== x0 && cx !== x1) continue
          const list = this.cells[cy * this.nx + cx]!
          for (let i = 0; i < list.length; i++) {
            const id = list[i]!
            const ex = this.xs[id]! - x, ey = this.ys[id]! - y
            const d2 = ex * ex + ey * ey
            if (found < k) {
              let j = found++
              while (j > 0 && d2s[j - 1]! > d2) { d2s[j] = d2s[j - 1]!; ids[j] = ids[j - 1]!; j-- }
              d2s[j] = d2; ids[j] = id
            }
            else if (d2 < d2s[k - 1]!) {
              let j = k - 1
              while (j > 0 && d2s[j - 1]! > d2) { d2s[j] = d2s[j - 1]!; ids[j] = ids[j - 1]!; j-- }
              d2s[j] = d2; ids[j] = id
            }
          }
        }
      }
      if (ring > 0 && x0 < 0 && y0 < 0 && x1 >= this.nx && y1 >= this.ny) break
    }
    return found
  }
}

/** A grid holding a fixed point set, ids 0..n-1, with about `perCell` points per cell. */
export function gridOf(points: ArrayLike<readonly [number, number]>, perCell = 2, bounds?: Bounds, minCell = 0): PointGrid {
  const b = bounds ?? boundsOf(points)
  const area = Math.max((b.xmax - b.xmin) * (b.ymax - b.ymin), 1e-12)
  const cell = Math.max(Math.sqrt((area * perCell) / Math.max(points.length, 1)), minCell, 1e-3)
  const g = new PointGrid(b, cell, points.length)
  for (let i = 0; i < points.length; i++) g.insert(i, points[i]![0], points[i]![1])
  return g
}
