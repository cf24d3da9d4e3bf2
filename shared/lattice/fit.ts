// Lattice fit: register a surface's site lattice to adatom marks, x ≈ t + M·(i·a1 + j·a2 + s_b).
// Orientation from structure-factor phase coherence, then robust least squares grown outward.
//
// Method
//  1. Pairs: difference vectors between nearby marks (a few mark spacings, at most 3000, shortest
//     first). Drift of a few % moves a short pair by much less than a cell, so their phase
//     coherence survives it.
//  2. Orientation: maximise the pair coherence (fit-search.ts) over θ in the face's symmetry range
//     ((111) ±30°, (100) ±45°, (110) ±90°); up to 3 maxima scoring ≥ 0.4 × the best go on. With
//     affine on, a pattern search over the full 2 × 2 map then maximises the same score, so
//     anisotropic scale and shear are taken up before any index is assigned.
//  3. Origin: candidates t = x_a − M·s_b for the 8 marks nearest the coordinate-wise median and
//     every basis offset b, scored by a truncated quadratic loss over the 24 most central marks.
//  4. Growth: marks are taken in order of distance from the median, first the innermost 10, then
//     the radius grows ×1.3 per stage. At each stage every active mark gets integer indices (its
//     nearest site under the current model), inliers are those within a robust threshold (5 σ from
//     the median residual, at most 0.3 × the smallest site separation), and the model is refitted
//     by least squares (rigid: rotation + translation at the handbook scale; affine: full 2 × 2 +
//     translation), until the assignment stops changing.
//  5. The candidate with the most inliers (then the lowest RMS) wins. The index origin is moved to
//     the site of the chosen type nearest the inliers' centroid.
// Reliability needs ≳ 10 marks spread over more than one direction; with fewer, several
// registrations fit about equally well.
// Output convention: `origin` is a site of the chosen type; site (i, j) = origin + i·a1 + j·a2, and
// for types with several sites per cell (bridge) site (i, j, b) adds basis[b] (basis[0] = [0, 0]).
// Indices agree with the blueprint's ideal frame: ideal position i·a1 + j·a2 + offset[b].
// Marks alone cannot distinguish orientations related by the site set's symmetry (e.g. fcc vs hcp
// sense on (111)), so rotation_deg is reported within the symmetry range.
import { InputError } from '../errors'
import { type Lattice, compileLattice } from './lattice'
import { siteSetGeometry } from './cell'
import { GridIndex } from './grid-index'
import { type Assignment, type Model, assign, inlierThreshold, refit, rigidModel } from './fit-refine'
import { reciprocalSet, refineLinear, searchOrientation } from './fit-search'
import { type Surface, getSiteType, resolveSurface } from './surfaces'
import { type Vec2, DEG, isFiniteVec } from './vec'

export { orientationFromFFT } from './orientation'

export interface LatticeFitOptions {
  surface: string | Surface
  site?: string
  marks: Vec2[]
  /** Also fit drift and piezo creep (full 2 × 2); default true. */
  affine?: boolean
  /** Seed for the rotation (e.g. from orientationFromFFT): the search then spans ±3° around it. */
  rotation_hint_deg?: number
}

export interface LatticeFitResult {
  surface: string
  site: string
  a1: Vec2
  a2: Vec2
  origin: Vec2
  basis?: Vec2[]
  rotation_deg: number
  /** RMS residual over inliers, nm. */
  residual_nm: number
  outliers: number[]
  /** Distance of every mark from its assigned site, nm. */
  residuals_nm: number[]
  /** Integer site indices [i, j, b] of every mark (outliers: their nearest site). */
  indices: [number, number, number][]
  /** Maps ideal-frame vectors to scan-frame vectors: scan = origin + affine·(ideal − ideal of site (0, 0, 0)). */
  affine: [[number, number], [number, number]]
  /** |a1|, |a2| relative to the handbook cell. */
  scale: [number, number]
  /** Change of the angle between a1 and a2 from the ideal cell, degrees. */
  shear_deg: number
  model: 'affine' | 'rigid'
  threshold_nm: number
  inliers: number
}

interface Trial { model: Model, a: Assignment, inlier: Uint8Array, count: number, rms: number, affine: boolean, thr: number }

function validate(opts: LatticeFitOptions): { surface: Surface, site: ReturnType<typeof getSiteType>, marks: Float64Array } {
  const surface = resolveSurface(opts.surface)
  const site = getSiteType(surface, opts.site)
  if (!Array.isArray(opts.marks) || opts.marks.length < 3) throw new InputError('marks', `a lattice fit needs at least 3 marks (got ${Array.isArray(opts.marks) ? opts.marks.length : 0})`)
  const marks = new Float64Array(opts.marks.length * 2)
  opts.marks.forEach((m, k) => {
    if (!isFiniteVec(m)) throw new InputError(`marks[${k}]`, 'each mark must be two finite numbers [x, y] in nm')
    marks[2 * k] = m[0]
    marks[2 * k + 1] = m[1]
  })
  if (opts.rotation_hint_deg !== undefined && !Number.isFinite(opts.rotation_hint_deg)) throw new InputError('rotation_hint_deg', 'rotation_hint_deg must be a finite number')
  return { surface, site, marks }
}

function median(v: number[]): number {
  const s = [...v].sort((a, b) => a - b)
  return s.length % 2 ? s[(s.length - 1) >> 1]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2
}

export function fitLattice(opts: LatticeFitOptions): LatticeFitResult {
  const { surface, site, marks } = validate(opts)
  const affine = opts.affine ?? true
  const n = marks.length >> 1
  const off0 = site.offsets_nm[0]!
  const basisRel = site.offsets_nm.map(o => [o[0] - off0[0], o[1] - off0[1]] as Vec2)
  const ideal: Lattice = { a1: surface.a1, a2: surface.a2, origin: [0, 0], basis: basisRel }
  const { minSeparation_nm } = siteSetGeometry(ideal)
  const cap = 0.3 * minSeparation_nm
  const floor = 0.02 * minSeparation_nm

  const xs: number[] = [], ys: number[] = []
  for (let k = 0; k < n; k++) {
    xs.push(marks[2 * k]!)
    ys.push(marks[2 * k + 1]!)
  }
  const cx = median(xs), cy = median(ys)
  const dist = Array.from({ length: n }, (_, k) => Math.hypot(marks[2 * k]! - cx, marks[2 * k + 1]! - cy))
  const byDist = Array.from({ length: n }, (_, k) => k).sort((p, q) => dist[p]! - dist[q]!)
  const core = byDist.slice(0, Math.min(n, 24))

  const G = reciprocalSet(surface.a1, surface.a2, basisRel)
  const pairs = shortPairs(marks, byDist, surface.nn_nm)
  // A few thousand pairs fix the orientation and the linear map well enough for the index
  // assignment; the least-squares stage then uses every mark.
  const orientations = searchOrientation(pairs, G, { period_deg: surface.symmetry_deg, hint_deg: opts.rotation_hint_deg, candidates: 3 })
  // Marks piled on one spot leave the orientation open: keep the hint (or 0°).
  if (orientations.length === 0) orientations.push({ theta_rad: (opts.rotation_hint_deg ?? 0) * DEG, score: 0 })

  let best: Trial | undefined
  const top = orientations[0]?.score ?? 0
  for (const o of orientations) {
    // True orientations score far above spurious maxima (≈ 0.8 vs ≈ 0.05 on clean marks).
    if (o.score < 0.4 * top) continue
    let start = rigidModel(o.theta_rad, 1, 0, 0)
    if (affine && n >= 6) {
      const lin = refineLinear(pairs.subarray(0, Math.min(pairs.length, 2 * 600)), G, o.theta_rad)
      start = { m11: lin.M[0], m12: lin.M[1], m21: lin.M[2], m22: lin.M[3], tx: 0, ty: 0 }
    }
    const trial = refine(marks, ideal, start, core, byDist, dist, basisRel, affine, floor, cap)
    if (!best || trial.count > best.count || (trial.count === best.count && trial.rms < best.rms)) best = trial
  }
  if (!best || best.count < 3) throw new InputError('marks', `fewer than 3 marks agree with a ${surface.id} ${site.name}-site lattice`)
  return report(best, marks, surface, site.name, ideal, basisRel)
}

/**
 * Difference vectors of nearby marks (central marks first, at most `cap` pairs), sorted by length.
 * Radius: 3 × the median mark-to-mark nearest distance, at least 4 substrate spacings, widened
 * until there are ≥ 2 pairs per mark (up to 40 spacings; beyond that only if no pair is found):
 * long enough to span several cells, short enough that a few % of drift moves a pair by much
 * less than a cell.
 */
function shortPairs(marks: Float64Array, byDist: number[], nn_nm: number, cap = 3000): Float64Array {
  const n = marks.length >> 1
  const index = new GridIndex(marks, undefined, 'marks')
  const rank = new Int32Array(n)
  byDist.forEach((k, pos) => {
    rank[k] = pos
  })
  const nnd: number[] = []
  for (let k = 0; k < n; k++) {
    const q = index.nearest(marks[2 * k]!, marks[2 * k + 1]!, k)
    if (q >= 0) nnd.push(Math.hypot(marks[2 * q]! - marks[2 * k]!, marks[2 * q + 1]! - marks[2 * k + 1]!))
  }
  let r = Math.min(40 * nn_nm, Math.max(4 * nn_nm, 3 * median(nnd)))
  let out: number[] = []
  for (;;) {
    out = []
    const buf: number[] = []
    for (const a of byDist) {
      buf.length = 0
      index.withinRadius(marks[2 * a]!, marks[2 * a + 1]!, r, buf)
      for (const b of buf) {
        // Each unordered pair once: take it from the endpoint that comes first in byDist order.
        if (b === a || rank[b]! < rank[a]!) continue
        out.push(marks[2 * b]! - marks[2 * a]!, marks[2 * b + 1]! - marks[2 * a + 1]!)
      }
      if (out.length >= 2 * cap) break
    }
    if (out.length >= 4 * n || out.length >= 2 * cap || r === Infinity) break
    if (r >= 40 * nn_nm) {
      if (out.length > 0) break
      // Very sparse marks: fall back to every pair (central marks first).
      r = Infinity
      continue
    }
    r = Math.min(40 * nn_nm, r * 1.5)
  }
  const m = Math.min(out.length >> 1, cap)
  const order = Array.from({ length: m }, (_, k) => k).sort((p, q) => Math.hypot(out[2 * p]!, out[2 * p + 1]!) - Math.hypot(out[2 * q]!, out[2 * q + 1]!))
  const sorted = new Float64Array(2 * m)
  order.forEach((k, pos) => {
    sorted[2 * pos] = out[2 * k]!
    sorted[2 * pos + 1] = out[2 * k + 1]!
  })
  return sorted
}

function sameAssignment(p: Assignment, q: Assignment): boolean {
  for (let k = 0; k < p.i.length; k++) {
    if (p.i[k] !== q.i[k] || p.j[k] !== q.j[k] || p.b[k] !== q.b[k]) return false
  }
  return true
}

function refine(marks: Float64Array, ideal: Lattice, m0: Model, core: number[], byDist: number[], dist: number[],
  basisRel: Vec2[], affine: boolean, floor: number, cap: number): Trial {
  const n = marks.length >> 1
  // Origin candidates from the most central marks.
  let model = m0
  let bestLoss = Infinity
  const coreMarks = new Float64Array(core.length * 2)
  core.forEach((k, m) => {
    coreMarks[2 * m] = marks[2 * k]!
    coreMarks[2 * m + 1] = marks[2 * k + 1]!
  })
  for (const a of core.slice(0, 8)) {
    for (const sb of basisRel) {
      const cand = { ...m0, tx: marks[2 * a]! - (m0.m11 * sb[0] + m0.m12 * sb[1]), ty: marks[2 * a + 1]! - (m0.m21 * sb[0] + m0.m22 * sb[1]) }
      const asg = assign(coreMarks, cand, ideal)
      let loss = 0
      for (const r of asg.residual) loss += Math.min(r * r, cap * cap)
      if (loss < bestLoss) {
        bestLoss = loss
        model = cand
      }
    }
  }
  // Marks sorted by distance from the centre: the active set of each stage is a prefix.
  const sm = new Float64Array(2 * n)
  byDist.forEach((k, pos) => {
    sm[2 * pos] = marks[2 * k]!
    sm[2 * pos + 1] = marks[2 * k + 1]!
  })
  const sd = byDist.map(k => dist[k]!)
  let usedAffine = false
  // Start from the innermost marks: across them an uncorrected drift of a few % stays well below
  // the inlier threshold, so their indices are right and the first affine refit is sound.
  let m = Math.min(n, 10)
  let prev: Assignment | undefined
  for (let stage = 0; stage < 60; stage++) {
    const sub = sm.subarray(0, 2 * m)
    const all = new Uint8Array(m).fill(1)
    const inl = new Uint8Array(m)
    for (let it = 0; it < 8; it++) {
      const a = assign(sub, model, ideal)
      const thr = inlierThreshold(a.residual, all, floor, cap)
      for (let k = 0; k < m; k++) inl[k] = a.residual[k]! <= thr ? 1 : 0
      const fitted = refit(sub, a, inl, model, affine)
      model = fitted.model
      usedAffine = fitted.affine
      const same = prev !== undefined && prev.i.length === m && sameAssignment(prev, a)
      prev = a
      if (same) break
    }
    if (m === n) break
    // Grow the radius by 1.3 (at least one more mark).
    const r = sd[m - 1]! * 1.3
    let next = m + 1
    while (next < n && sd[next]! <= r) next++
    m = Math.min(n, next)
  }
  const a = assign(marks, model, ideal)
  const inlier = new Uint8Array(n)
  const thr = inlierThreshold(a.residual, new Uint8Array(n).fill(1), floor, cap)
  let count = 0, ss = 0
  for (let k = 0; k < n; k++) {
    inlier[k] = a.residual[k]! <= thr ? 1 : 0
    if (inlier[k]) {
      count++
      ss += a.residual[k]! ** 2
    }
  }
  return { model, a, inlier, count, rms: count ? Math.sqrt(ss / count) : Infinity, affine: usedAffine, thr }
}

function report(t: Trial, marks: Float64Array, surface: Surface, siteName: string, ideal: Lattice, basisRel: Vec2[]): LatticeFitResult {
  const n = marks.length >> 1
  const { model: M } = t
  // Move the index origin to the type-0 site nearest the inliers' centroid.
  let mx = 0, my = 0
  for (let k = 0; k < n; k++) if (t.inlier[k]) {
    mx += marks[2 * k]!
    my += marks[2 * k + 1]!
  }
  mx /= t.count
  my /= t.count
  const det = M.m11 * M.m22 - M.m12 * M.m21
  const qx = (M.m22 * (mx - M.tx) - M.m12 * (my - M.ty)) / det
  const qy = (-M.m21 * (mx - M.tx) + M.m11 * (my - M.ty)) / det
  const bravais = compileLattice({ a1: ideal.a1, a2: ideal.a2, origin: [0, 0] })
  const u = bravais.i11 * qx + bravais.i12 * qy
  const v = bravais.i21 * qx + bravais.i22 * qy
  let i0 = Math.round(u), j0 = Math.round(v), bestD = Infinity
  for (let di = -1; di <= 1; di++) {
    for (let dj = -1; dj <= 1; dj++) {
      const ii = Math.round(u) + di, jj = Math.round(v) + dj
      const d = Math.hypot(qx - ii * ideal.a1[0] - jj * ideal.a2[0], qy - ii * ideal.a1[1] - jj * ideal.a2[1])
      if (d < bestD) {
        bestD = d
        i0 = ii
        j0 = jj
      }
    }
  }
  const mul = (p: Vec2): Vec2 => [M.m11 * p[0] + M.m12 * p[1], M.m21 * p[0] + M.m22 * p[1]]
  const a1 = mul(surface.a1)
  const a2 = mul(surface.a2)
  const origin: Vec2 = [M.tx + i0 * a1[0] + j0 * a2[0], M.ty + i0 * a1[1] + j0 * a2[1]]
  const outliers: number[] = []
  const residuals_nm: number[] = []
  const indices: [number, number, number][] = []
  for (let k = 0; k < n; k++) {
    if (!t.inlier[k]) outliers.push(k)
    residuals_nm.push(t.a.residual[k]!)
    indices.push([t.a.i[k]! - i0, t.a.j[k]! - j0, t.a.b[k]!])
  }
  const l1 = Math.hypot(...surface.a1), l2 = Math.hypot(...surface.a2)
  const ang = (p: Vec2, q: Vec2) => Math.acos((p[0] * q[0] + p[1] * q[1]) / (Math.hypot(...p) * Math.hypot(...q))) / DEG
  const out: LatticeFitResult = {
    surface: surface.id, site: siteName, a1, a2, origin,
    rotation_deg: Math.atan2(M.m21 - M.m12, M.m11 + M.m22) / DEG,
    residual_nm: t.rms, outliers, residuals_nm, indices,
    affine: [[M.m11, M.m12], [M.m21, M.m22]],
    scale: [Math.hypot(...a1) / l1, Math.hypot(...a2) / l2],
    shear_deg: ang(a1, a2) - ang(surface.a1, surface.a2),
    model: t.affine ? 'affine' : 'rigid',
    threshold_nm: t.thr,
    inliers: t.count,
  }
  if (basisRel.length > 1) out.basis = basisRel.map(mul)
  return out
}

/** The fit as a plain lattice (site (i, j, b) = origin + i·a1 + j·a2 + basis[b]). */
export function fitToLattice(fit: Pick<LatticeFitResult, 'a1' | 'a2' | 'origin' | 'basis'>): Lattice {
  const lat: Lattice = { a1: fit.a1, a2: fit.a2, origin: fit.origin }
  if (fit.basis && fit.basis.length > 1) lat.basis = fit.basis
  return lat
}
