// Fixed-seed generators for synthetic test inputs (mulberry32 PRNG, Box–Muller normals).
import type { Vec2 } from '../../../shared/lattice/vec'
import { mulberry32 } from '../../../shared/scan/synthetic'

/** The same seeded PRNG as the scan core's synthetic topographs. */
export function rng(seed: number): () => number {
  return mulberry32(seed)
}

export function normal(rand: () => number): number {
  const u = Math.max(rand(), 1e-12)
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * rand())
}

export interface SyntheticMarks {
  marks: Vec2[]
  /** Ideal-frame site indices [i, j, b] for each true mark; null for an outlier. */
  truth: ([number, number, number] | null)[]
  outliers: number[]
}

/**
 * Marks on distinct random sites (i, j, b) within |i|, |j| ≤ half, mapped by scan = t + M·ideal,
 * plus Gaussian noise σ and `nOut` outliers placed half-way between sites.
 */
export function syntheticMarks(opts: {
  seed: number
  count: number
  half: number
  a1: Vec2
  a2: Vec2
  basis: Vec2[]
  M: [[number, number], [number, number]]
  t: Vec2
  sigma_nm: number
  nOut: number
}): SyntheticMarks {
  const rand = rng(opts.seed)
  const used = new Set<string>()
  const marks: Vec2[] = []
  const truth: ([number, number, number] | null)[] = []
  const map = (p: Vec2): Vec2 => [opts.t[0] + opts.M[0][0] * p[0] + opts.M[0][1] * p[1], opts.t[1] + opts.M[1][0] * p[0] + opts.M[1][1] * p[1]]
  while (marks.length < opts.count) {
    const i = Math.floor(rand() * (2 * opts.half + 1)) - opts.half
    const j = Math.floor(rand() * (2 * opts.half + 1)) - opts.half
    const b = Math.floor(rand() * opts.basis.length)
    const key = `${i},${j},${b}`
    if (used.has(key)) continue
    used.add(key)
    const s = opts.basis[b]!
    const p = map([i * opts.a1[0] + j * opts.a2[0] + s[0], i * opts.a1[1] + j * opts.a2[1] + s[1]])
    marks.push([p[0] + opts.sigma_nm * normal(rand), p[1] + opts.sigma_nm * normal(rand)])
    truth.push([i, j, b])
  }
  const outliers: number[] = []
  for (let k = 0; k < opts.nOut; k++) {
    const i = Math.floor(rand() * (2 * opts.half)) - opts.half
    const j = Math.floor(rand() * (2 * opts.half)) - opts.half
    // Half a cell off every site of a Bravais set: as far from the lattice as a point can be.
    const p = map([(i + 0.5) * opts.a1[0] + (j + 0.25) * opts.a2[0] + opts.basis[0]![0], (i + 0.5) * opts.a1[1] + (j + 0.25) * opts.a2[1] + opts.basis[0]![1]])
    const at = Math.floor(rand() * (marks.length + 1))
    marks.splice(at, 0, p)
    truth.splice(at, 0, null)
  }
  truth.forEach((t, k) => {
    if (t === null) outliers.push(k)
  })
  return { marks, truth, outliers }
}
