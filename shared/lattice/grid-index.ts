// Uniform-grid spatial index (bucket grid, cell ≈ mean point spacing) over a fixed point list:
// nearest neighbour by expanding square rings, radius queries, k nearest.
import { InputError } from '../errors'

export class GridIndex {
  readonly xy: Float64Array
  readonly n: number
  readonly x0: number
  readonly y0: number
  readonly cell: number
  readonly nx: number
  readonly ny: number
  /** Points of cell c are order[start[c] .. start[c + 1]). */
  private readonly start: Int32Array
  private readonly order: Int32Array

  /** xy: interleaved coordinates [x0, y0, x1, y1, …]; cell_nm defaults to the mean spacing. */
  constructor(xy: Float64Array | number[], cell_nm?: number, field = 'points') {
    this.xy = xy instanceof Float64Array ? xy : Float64Array.from(xy)
    this.n = this.xy.length >> 1
    let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity
    for (let k = 0; k < this.n; k++) {
      const x = this.xy[2 * k]!
      const y = this.xy[2 * k + 1]!
      if (!Number.isFinite(x) || !Number.isFinite(y)) throw new InputError(`${field}[${k}]`, 'coordinates must be finite numbers')
      if (x < x0) x0 = x
      if (x > x1) x1 = x
      if (y < y0) y0 = y
      if (y > y1) y1 = y
    }
    if (this.n === 0) {
      x0 = y0 = 0
      x1 = y1 = 1
    }
    const w = Math.max(x1 - x0, 1e-9)
    const h = Math.max(y1 - y0, 1e-9)
    let cell = cell_nm ?? Math.sqrt((w * h) / Math.max(1, this.n))
    // Degenerate extents (a line of points) or tiny cells must not blow up the cell count.
    cell = Math.max(cell, Math.max(w, h) / 4096, 1e-9)
    if (!(cell > 0) || !Number.isFinite(cell)) throw new InputError('cell_nm', 'cell size must be a positive number')
    while (Math.ceil(w / cell + 1e-9) * Math.ceil(h / cell + 1e-9) > 4 * this.n + 16) cell *= 1.5
    this.x0 = x0
    this.y0 = y0
    this.cell = cell
    this.nx = Math.max(1, Math.ceil(w / cell + 1e-9))
    this.ny = Math.max(1, Math.ceil(h / cell + 1e-9))
    const nc = this.nx * this.ny
    const cellOf = new Int32Array(this.n)
    const start = new Int32Array(nc + 1)
    for (let k = 0; k < this.n; k++) {
      const c = this.cellIndex(this.xy[2 * k]!, this.xy[2 * k + 1]!)
      cellOf[k] = c
      start[c + 1]!++
    }
    for (let c = 0; c < nc; c++) start[c + 1]! += start[c]!
    const fill = start.slice(0, nc)
    const order = new Int32Array(this.n)
    for (let k = 0; k < this.n; k++) order[fill[cellOf[k]!]!++] = k
    this.start = start
    this.order = order
  }

  private cx(x: number): number { return Math.min(this.nx - 1, Math.max(0, Math.floor((x - this.x0) / this.cell))) }
  private cy(y: number): number { return Math.min(this.ny - 1, Math.max(0, Math.floor((y - this.y0) / this.cell))) }
  private cellIndex(x: number, y: number): number { return this.cy(y) * this.nx + this.cx(x) }

  /**
   * Index of the point nearest (x, y), or −1 when empty (or only `exclude`). Rings of cells grow
   * until the nearest candidate is closer than the edge of the searched square. For queries outside
   * the grid, distances to the grid from the query's projection onto it bound those from the query
   * itself (projection onto a convex set), so the same stopping rule holds.
   */
  nearest(x: number, y: number, exclude = -1): number {
    if (this.n === 0) return -1
    const gx = Math.min(Math.max(x, this.x0), this.x0 + this.nx * this.cell)
    const gy = Math.min(Math.max(y, this.y0), this.y0 + this.ny * this.cell)
    const cx = this.cx(gx)
    const cy = this.cy(gy)
    let best = -1
    let bestD2 = Infinity
    const maxR = Math.max(this.nx, this.ny)
    for (let r = 0; r <= maxR; r++) {
      const i0 = cx - r, i1 = cx + r, j0 = cy - r, j1 = cy + r
      for (let j = Math.max(0, j0); j <= Math.min(this.ny - 1, j1); j++) {
        const edgeRow = j === j0 || j === j1
        // Inner rows of the ring contribute only their two end cells.
        const step = edgeRow ? 1 : i1 - i0
        for (let i = i0; i <= i1; i += step) {
          if (i < 0 || i >= this.nx) continue
          const c = j * this.nx + i
          for (let s = this.start[c]!, e = this.start[c + 1]!; s < e; s++) {
            const k = this.order[s]!
            if (k === exclude) continue
            const dx = this.xy[2 * k]! - x
            const dy = this.xy[2 * k + 1]! - y
            const d2 = dx * dx + dy * dy
            if (d2 < bestD2 || (d2 === bestD2 && k < best)) {
              bestD2 = d2
              best = k
            }
          }
        }
      }
      if (best >= 0) {
        // Distance from the (projected) query to the outside of the searched square.
        const lb = Math.min(gx - (this.x0 + i0 * this.cell), this.x0 + (i1 + 1) * this.cell - gx, gy - (this.y0 + j0 * this.cell), this.y0 + (j1 + 1) * this.cell - gy)
        if (lb * lb >= bestD2) break
      }
    }
    return best
  }

  /** Indices of all points within radius r of (x, y) (inclusive), in no particular order. */
  withinRadius(x: number, y: number, r: number, out: number[] = []): number[] {
    if (this.n === 0 || !(r >= 0)) return out
    const i0 = Math.max(0, Math.floor((x - r - this.x0) / this.cell))
    const i1 = Math.min(this.nx - 1, Math.floor((x + r - this.x0) / this.cell))
    const j0 = Math.max(0, Math.floor((y - r - this.y0) / this.cell))
    const j1 = Math.min(this.ny - 1, Math.floor((y + r - this.y0) / this.cell))
    const r2 = r * r
    for (let j = j0; j <= j1; j++) {
      for (let i = i0; i <= i1; i++) {
        const c = j * this.nx + i
        for (let s = this.start[c]!, e = this.start[c + 1]!; s < e; s++) {
          const k = this.order[s]!
          const dx = this.xy[2 * k]! - x
          const dy = this.xy[2 * k + 1]! - y
          if (dx * dx + dy * dy <= r2) out.push(k)
        }
      }
    }
    return out
  }

  /** The k nearest points, closest first (ties by index). */
  kNearest(x: number, y: number, k: number): number[] {
    const want = Math.min(Math.max(0, Math.floor(k)), this.n)
    if (want === 0) return []
    // Grow a radius until it holds k points, then sort those: the k-th distance is then exact.
    let r = this.cell * Math.sqrt(want / Math.PI) + this.cell
    const gx = Math.min(Math.max(x, this.x0), this.x0 + this.nx * this.cell)
    const gy = Math.min(Math.max(y, this.y0), this.y0 + this.ny * this.cell)
    r += Math.hypot(x - gx, y - gy)
    let found = this.withinRadius(x, y, r, [])
    while (found.length < want) {
      r *= 1.6
      found = this.withinRadius(x, y, r, [])
    }
    const d2 = (p: number) => (this.xy[2 * p]! - x) ** 2 + (this.xy[2 * p + 1]! - y) ** 2
    const keyed = found.map(p => ({ p, d: d2(p) }))
    keyed.sort((a, b) => a.d - b.d || a.p - b.p)
    return keyed.slice(0, want).map(e => e.p)
  }

  /** Every unordered pair (a < b) closer than or at distance r; calls fn(a, b, d). */
  forEachPairWithin(r: number, fn: (a: number, b: number, d: number) => void): void {
    const buf: number[] = []
    for (let a = 0; a < this.n; a++) {
      buf.length = 0
      this.withinRadius(this.xy[2 * a]!, this.xy[2 * a + 1]!, r, buf)
      for (const b of buf) {
        if (b <= a) continue
        fn(a, b, Math.hypot(this.xy[2 * a]! - this.xy[2 * b]!, this.xy[2 * a + 1]! - this.xy[2 * b + 1]!))
      }
    }
  }
}
