// Fixed-seed generators of synthetic inputs for the route tests (mulberry32; invented data only).
export type P = [number, number]

export function rng(seed: number): () => number {
  let s = seed >>> 0
  return () => {
    s = (s + 0x6D2B79F5) >>> 0
    let t = Math.imul(s ^ (s >>> 15), 1 | s)
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Points uniform in a box, at least minD apart (rejection sampling). */
export function scatter(R: () => number, n: number, box: [number, number, number, number], minD = 0): P[] {
  const [x0, x1, y0, y1] = box
  const out: P[] = []
  for (let tries = 0; out.length < n && tries < n * 500; tries++) {
    const p: P = [x0 + R() * (x1 - x0), y0 + R() * (y1 - y0)]
    if (out.every(q => Math.hypot(q[0] - p[0], q[1] - p[1]) >= minD)) out.push(p)
  }
  return out
}

export const A_CU = 0.2553 // Cu(111) nearest-neighbour distance a/√2 with a = 3.61 Å (Ashcroft & Mermin Table 4.3)
export const HEX = { a1: [A_CU, 0] as P, a2: [-A_CU / 2, (A_CU * Math.sqrt(3)) / 2] as P, origin: [0, 0] as P }

/** Nearest point of the 120° hexagonal lattice HEX. */
export function snapHex(p: P): P {
  const h = (A_CU * Math.sqrt(3)) / 2
  const j = Math.round(p[1] / h)
  const i = Math.round((p[0] + (j * A_CU) / 2) / A_CU)
  return [i * A_CU - (j * A_CU) / 2, j * h]
}

export function ring(n: number, r: number, c: P = [0, 0]): P[] {
  return Array.from({ length: n }, (_, i) => [c[0] + r * Math.cos((2 * Math.PI * i) / n), c[1] + r * Math.sin((2 * Math.PI * i) / n)] as P)
}

/** Honeycomb patch with nearest-neighbour spacing 3·a along the close-packed directions of HEX. */
export function honeycomb(n: number): P[] {
  const h = (A_CU * Math.sqrt(3)) / 2
  const at = (i: number, j: number): P => [i * A_CU - (j * A_CU) / 2, j * h]
  const steps: Array<[number, number]> = [[3, 0], [-3, -3], [0, 3]]
  const seen = new Set<string>(['0,0'])
  const q: Array<[number, number, number]> = [[0, 0, 0]]
  for (let k = 0; k < q.length && q.length < 3 * n + 10; k++) {
    const [i, j, sub] = q[k]!
    for (const [di, dj] of steps) {
      const ni = sub === 0 ? i + di : i - di, nj = sub === 0 ? j + dj : j - dj
      const key = `${ni},${nj}`
      if (!seen.has(key)) { seen.add(key); q.push([ni, nj, 1 - sub]) }
    }
  }
  return q.map(([i, j]) => at(i, j)).sort((p1, p2) => Math.hypot(...p1) - Math.hypot(...p2)).slice(0, n)
}
