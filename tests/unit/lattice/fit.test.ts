import { describe, expect, it } from 'vitest'
import { type LatticeFitResult, type Surface, fitLattice, getSiteType, getSurface, parseLatticeFitInput } from '../../../shared/lattice'
import { expectInputError } from './helpers'
import { syntheticMarks } from './synthetic'

type M2 = [[number, number], [number, number]]
const DEG = Math.PI / 180

/** Scan map M = R(θ)·D with D = [[sx, tan(shear)], [0, sy]]: anisotropic scale and shear (drift, creep). */
function distortion(theta_deg: number, sx: number, sy: number, shear_deg: number): M2 {
  const c = Math.cos(theta_deg * DEG), s = Math.sin(theta_deg * DEG)
  const D: M2 = [[sx, Math.tan(shear_deg * DEG)], [0, sy]]
  return [[c * D[0][0] - s * D[1][0], c * D[0][1] - s * D[1][1]], [s * D[0][0] + c * D[1][0], s * D[0][1] + c * D[1][1]]]
}

function setup(id: string, siteName: string, M: M2, opts: { seed: number, count: number, half: number, sigma: number, nOut: number }) {
  const s = getSurface(id)
  const st = getSiteType(s, siteName)
  const off0 = st.offsets_nm[0]!
  const basis = st.offsets_nm.map(o => [o[0] - off0[0], o[1] - off0[1]] as [number, number])
  const t: [number, number] = [5.3, -3.1]
  const syn = syntheticMarks({ seed: opts.seed, count: opts.count, half: opts.half, a1: s.a1, a2: s.a2, basis, M, t, sigma_nm: opts.sigma, nOut: opts.nOut })
  // Noise-free scan position of ideal site (i, j, b), relative to the type's site (0, 0, 0).
  const truePos = (i: number, j: number, b: number) => {
    const p = [i * s.a1[0] + j * s.a2[0] + basis[b]![0], i * s.a1[1] + j * s.a2[1] + basis[b]![1]]
    return [t[0] + M[0][0] * p[0]! + M[0][1] * p[1]!, t[1] + M[1][0] * p[0]! + M[1][1] * p[1]!]
  }
  return { s, syn, truePos }
}

/** Checks shared by every recovery case; tolerances are stated per call. */
function checkRecovery(fit: LatticeFitResult, s: Surface, M: M2, ctx: ReturnType<typeof setup>, tol: { matrix: number, position_nm: number }) {
  for (const r of [0, 1]) for (const c of [0, 1]) expect(Math.abs(fit.affine[r]![c]! - M[r]![c]!)).toBeLessThan(tol.matrix)
  expect(fit.outliers).toEqual(ctx.syn.outliers)
  // Fitted indices differ from the true ones by one lattice translation for every true mark.
  let shift: [number, number] | undefined
  ctx.syn.truth.forEach((tr, k) => {
    if (!tr) return
    const [i, j, b] = fit.indices[k]!
    shift ??= [i - tr[0], j - tr[1]]
    expect([i - tr[0], j - tr[1], b]).toEqual([shift[0], shift[1], tr[2]])
    // The fitted lattice puts the site where the noise-free mark was.
    const off = fit.basis?.[b] ?? [0, 0]
    const px = fit.origin[0] + i * fit.a1[0] + j * fit.a2[0] + off[0]
    const py = fit.origin[1] + i * fit.a1[1] + j * fit.a2[1] + off[1]
    const [qx, qy] = ctx.truePos(tr[0], tr[1], tr[2])
    expect(Math.hypot(px - qx!, py - qy!)).toBeLessThan(tol.position_nm)
  })
  // origin is a site of the chosen type: the true site with index −shift.
  const [ox, oy] = ctx.truePos(-shift![0], -shift![1], 0)
  expect(Math.hypot(fit.origin[0] - ox!, fit.origin[1] - oy!)).toBeLessThan(tol.position_nm)
  expect(fit.a1[0]).toBeCloseTo(M[0][0] * s.a1[0] + M[0][1] * s.a1[1], 2)
}

describe('fitLattice recovers a known registration from synthetic marks', () => {
  it('Cu(111) fcc: 12° turn, 2 % anisotropic scale + 1° shear, σ = 0.01 nm noise, 6 outliers', () => {
    const M = distortion(12, 1.02, 1.0, 1)
    const ctx = setup('Cu(111)', 'fcc', M, { seed: 11, count: 300, half: 40, sigma: 0.01, nOut: 6 })
    const fit = fitLattice({ surface: 'Cu(111)', marks: ctx.syn.marks })
    expect(fit.model).toBe('affine')
    checkRecovery(fit, ctx.s, M, ctx, { matrix: 5e-4, position_nm: 0.01 })
    // RMS of a 2-D Gaussian residual is √2·σ (closed form); allow 15 % for the sample.
    expect(fit.residual_nm / (Math.SQRT2 * 0.01)).toBeGreaterThan(0.85)
    expect(fit.residual_nm / (Math.SQRT2 * 0.01)).toBeLessThan(1.15)
    expect(fit.scale[0]).toBeCloseTo(Math.hypot(M[0][0], M[1][0]), 3)
    expect(fit.inliers).toBe(300)
    expect(fit.residuals_nm).toHaveLength(306)
  })

  it('Ag(100) hollow: 4 % anisotropic drift and 1.5° shear across a 120-cell field (index assignment grown outward)', () => {
    const M = distortion(-31, 0.97, 1.01, 1.5)
    const ctx = setup('Ag(100)', 'hollow', M, { seed: 12, count: 500, half: 60, sigma: 0.008, nOut: 8 })
    const fit = fitLattice({ surface: 'Ag(100)', marks: ctx.syn.marks })
    checkRecovery(fit, ctx.s, M, ctx, { matrix: 5e-4, position_nm: 0.01 })
  })

  it('Pt(110) hollow, rigid model: rotation to 0.02°, handbook scale kept', () => {
    const M = distortion(-63, 1, 1, 0)
    const ctx = setup('Pt(110)', 'hollow', M, { seed: 13, count: 120, half: 25, sigma: 0.008, nOut: 3 })
    const fit = fitLattice({ surface: 'Pt(110)', marks: ctx.syn.marks, affine: false })
    expect(fit.model).toBe('rigid')
    expect(Math.abs(fit.rotation_deg - -63)).toBeLessThan(0.02)
    expect(fit.scale[0]).toBeCloseTo(1, 12)
    expect(fit.scale[1]).toBeCloseTo(1, 12)
    expect(fit.shear_deg).toBeCloseTo(0, 9)
    checkRecovery(fit, ctx.s, M, ctx, { matrix: 5e-4, position_nm: 0.01 })
  })

  it('Au(111) bridge sites (3 per cell): returns the basis, basis[0] = [0, 0]', () => {
    const M = distortion(7, 1.015, 0.995, -0.5)
    const ctx = setup('Au(111)', 'bridge', M, { seed: 14, count: 250, half: 30, sigma: 0.005, nOut: 4 })
    const fit = fitLattice({ surface: 'Au(111)', site: 'bridge', marks: ctx.syn.marks })
    expect(fit.basis).toHaveLength(3)
    expect(fit.basis![0]).toEqual([0, 0])
    checkRecovery(fit, ctx.s, M, ctx, { matrix: 1e-3, position_nm: 0.008 })
  })

  it('reports the rotation within the face symmetry range: a 47° turn on (111) reads as −13°', () => {
    const M = distortion(47, 1, 1, 0)
    const ctx = setup('Ni(111)', 'hcp', M, { seed: 15, count: 80, half: 20, sigma: 0.005, nOut: 0 })
    const fit = fitLattice({ surface: 'Ni(111)', site: 'hcp', marks: ctx.syn.marks })
    expect(Math.abs(fit.rotation_deg - -13)).toBeLessThan(0.05)
    expect(fit.outliers).toEqual([])
  })

  it('a rotation hint narrows the search to ±3° around it', () => {
    const M = distortion(12, 1, 1, 0)
    const ctx = setup('Pd(100)', 'top', M, { seed: 16, count: 60, half: 15, sigma: 0.005, nOut: 0 })
    const fit = fitLattice({ surface: 'Pd(100)', site: 'top', marks: ctx.syn.marks, rotation_hint_deg: 11 })
    expect(Math.abs(fit.rotation_deg - 12)).toBeLessThan(0.05)
  })

  it('collinear marks (a chain) fall back to the rigid model', () => {
    const s = getSurface('Cu(111)')
    const marks = Array.from({ length: 10 }, (_, k) => [1 + k * 3 * s.a1[0], 2 + k * 3 * s.a1[1]] as [number, number])
    const fit = fitLattice({ surface: s, marks })
    expect(fit.model).toBe('rigid')
    expect(fit.residual_nm).toBeLessThan(1e-9)
  })
})

describe('lattice fit input errors', () => {
  it('fewer than 3 marks, unknown surface, site not on the surface, non-finite marks', () => {
    expectInputError(() => fitLattice({ surface: 'Cu(111)', marks: [[0, 0], [1, 1]] }), 'marks')
    expectInputError(() => fitLattice({ surface: 'Cu(112)', marks: [[0, 0], [1, 1], [2, 0]] }), 'surface')
    expectInputError(() => fitLattice({ surface: 'Ag(100)', site: 'fcc', marks: [[0, 0], [1, 1], [2, 0]] }), 'site')
    expectInputError(() => fitLattice({ surface: 'Cu(111)', marks: [[0, 0], [1, Number.NaN], [2, 0]] }), 'marks[1]')
  })

  it('zod schema: names the field of the first problem', () => {
    expect(parseLatticeFitInput({ surface: 'Cu(111)', marks: [[0, 0], [1, 1], [2, 0]] }).affine).toBeUndefined()
    expectInputError(() => parseLatticeFitInput({ marks: [[0, 0], [1, 1], [2, 0]] }), 'surface')
    expectInputError(() => parseLatticeFitInput({ surface: 'Cu(111)', marks: [[0, 0], [1, 1], ['a', 0]] }), 'marks[2][0]')
    expectInputError(() => parseLatticeFitInput({ surface: 'Cu(111)', marks: [[0, 0], [1, Infinity], [2, 0]] }), 'marks[1][1]')
    expectInputError(() => parseLatticeFitInput({ surface: 'Cu(111)', marks: [[0, 0]] }), 'marks')
    expectInputError(() => parseLatticeFitInput({ surface: 'Cu(111)', marks: [[0, 0], [1, 1], [2, 0]], affine: 'yes' }), 'affine')
  })
})
