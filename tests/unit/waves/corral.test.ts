import { describe, expect, it } from 'vitest'
import * as BESSEL from 'bessel'
import { corralLevels, corralLdos, corralMap, corralModes, corralSpectrum, lorentzian } from '../../../shared/waves/corral'
import { computeCorral } from '../../../shared/waves/compute-corral'
import { HBAR2_2ME_eVnm2, cleanDos2D_per_eVnm2 } from '../../../shared/waves/constants'
import { isInputError } from '../../../shared/errors'
import { gaussLegendre, integrate } from './quadrature'

// The published 48-atom ring on Cu(111): R = 7.13 nm (Crommie, Lutz, Eigler, Science 262, 218
// (1993)); E0 = −0.44 eV, m* = 0.38 (Crommie, Lutz, Eigler, Nature 363, 524 (1993), from memory).
const CU = { radius_nm: 7.13, E0_eV: -0.44, m_eff: 0.38 }

function inputError(fn: () => unknown): { field: string, message: string } {
  try {
    fn()
  }
  catch (e) {
    if (isInputError(e)) return { field: e.field, message: e.message }
    throw e
  }
  throw new Error('expected an InputError')
}

describe('hard-wall corral levels', () => {
  it('reproduces the worked Cu(111) levels (derived)', () => {
    // E01 = −0.4286, E11 = −0.4110, E21 = −0.3880, E02 = −0.3799 eV (4 decimals)
    const lv = corralLevels({ ...CU, count: 4 })
    expect(lv.map(l => [l.m, l.n])).toEqual([[0, 1], [1, 1], [2, 1], [0, 2]])
    const want = [-0.4286, -0.4110, -0.3880, -0.3799]
    lv.forEach((l, i) => expect(Math.abs(l.E_eV - want[i]!)).toBeLessThan(5e-5))
    expect(lv.map(l => l.degeneracy)).toEqual([1, 2, 2, 1])
    // k_F·R = 14.94 with k_F = √(−E0·m*/(ħ²/2m_e)) (derived)
    const kF = Math.sqrt((0.44 * 0.38) / 0.0380998)
    expect(Math.abs(kF * 7.13 - 14.94)).toBeLessThan(0.005)
  })

  it('uses E = E0 + (ħ²/2m*)(j/R)² with j from A&S Table 9.5', () => {
    const lv = corralLevels({ ...CU, count: 1 })[0]!
    // j_{0,1} = 2.4048255577 (A&S Table 9.5); recomputed by hand from the formula
    expect(lv.E_eV).toBeCloseTo(-0.44 + (HBAR2_2ME_eVnm2 / 0.38) * (2.4048255577 / 7.13) ** 2, 10)
  })

  it('counts 28 distinct levels holding 51 orbitals below E_F for k_F·R in (14.93, 15.6)', () => {
    // Counting check (derived; 102 electrons with spin)
    for (const kR of [14.935, 15.0, 15.3, 15.58]) {
      const maxE = CU.E0_eV + (HBAR2_2ME_eVnm2 / CU.m_eff) * (kR / CU.radius_nm) ** 2
      const lv = corralLevels({ ...CU, maxE_eV: maxE })
      expect(lv.length).toBe(28)
      expect(lv.reduce((s, l) => s + l.degeneracy, 0)).toBe(51)
    }
    // just below j_{0,5} = 14.9309177085 (A&S Table 9.5) the (0,5) level drops out: 27 levels, 50 orbitals
    const maxE = CU.E0_eV + (HBAR2_2ME_eVnm2 / CU.m_eff) * (14.93 / CU.radius_nm) ** 2
    const lv = corralLevels({ ...CU, maxE_eV: maxE })
    expect([lv.length, lv.reduce((s, l) => s + l.degeneracy, 0)]).toEqual([27, 50])
  })

  it('returns levels sorted by energy, and the lowest `count` agree with an energy cut', () => {
    const a = corralLevels({ ...CU, count: 60 })
    for (let i = 1; i < a.length; i++) expect(a[i]!.E_eV).toBeGreaterThan(a[i - 1]!.E_eV)
    const b = corralLevels({ ...CU, maxE_eV: a[59]!.E_eV + 1e-12 })
    expect(b.slice(0, 60)).toEqual(a)
  })
})

describe('hard-wall eigenfunctions and LDOS', () => {
  const R = CU.radius_nm
  const modes = corralModes(corralLevels({ ...CU, count: 14 }), R)

  it('are orthonormal on the disk (Gauss–Legendre in r × trapezoid in θ)', () => {
    // orbitals ψ_{m,n,±} = √(weight/deg)·J_m(j r/R)·e^{±imθ}; J from the npm `bessel` package
    // so that the quadrature does not reuse the code under test
    const orbitals = modes.flatMap(md => (md.m === 0 ? [0] : [md.m, -md.m]).map(s => ({ md, s })))
    const { x, w } = gaussLegendre(80)
    const nTheta = 64 // exact for e^{iqθ} with |q| < 64
    for (const a of orbitals) {
      for (const b of orbitals) {
        let re = 0
        let im = 0
        for (let i = 0; i < x.length; i++) {
          const r = ((x[i]! + 1) * R) / 2
          const ja = BESSEL.besselj((a.md.j * r) / R, a.md.m)
          const jb = BESSEL.besselj((b.md.j * r) / R, b.md.m)
          const amp = Math.sqrt((a.md.weight_per_nm2 / a.md.degeneracy) * (b.md.weight_per_nm2 / b.md.degeneracy)) * ja * jb * r * w[i]! * (R / 2)
          for (let t = 0; t < nTheta; t++) {
            const th = (2 * Math.PI * t) / nTheta
            re += amp * Math.cos((b.s - a.s) * th) * ((2 * Math.PI) / nTheta)
            im += amp * Math.sin((b.s - a.s) * th) * ((2 * Math.PI) / nTheta)
          }
        }
        const same = a.md === b.md && a.s === b.s
        // tolerance set by the `bessel` package's ≈ 1e-8 accuracy
        expect(Math.abs(re - (same ? 1 : 0))).toBeLessThan(1e-6)
        expect(Math.abs(im)).toBeLessThan(1e-6)
      }
    }
  })

  it('obeys the sum rule ∫_disk ρ(r, E) dA = Σ_l deg_l·L_Γ(E − E_l)', () => {
    // By orthonormality, integrating the LDOS over the disk leaves the Lorentzians of the summed
    // levels. At E = E_l that is deg_l/(πΓ) (the level's own peak, L_Γ(0) = 1/(πΓ)) plus the tails
    // of all other summed levels. The right side is computed from the level list alone.
    const gamma = 0.004
    const set = corralModes(corralLevels({ ...CU, maxE_eV: 0.2 }), R)
    for (const target of [0, 1, 3, 7]) {
      const E = set[target]!.E_eV
      const lhs = integrate(r => 2 * Math.PI * r * corralLdos(set, R, r, E, gamma), 0, R, 60, 24)
      const own = set[target]!.degeneracy / (Math.PI * gamma)
      const tails = set.reduce((s, l, i) => (i === target ? s : s + l.degeneracy * lorentzian(E - l.E_eV, gamma)), 0)
      expect(Math.abs(lhs - (own + tails)) / (own + tails)).toBeLessThan(1e-10)
    }
  })

  it('maps agree with direct evaluation at the pixel centres and integrate to the sum rule', () => {
    const set = corralModes(corralLevels({ ...CU, maxE_eV: 0.5 }), R)
    const gamma = 0.01
    const E = -0.2
    const px = 200
    const map = corralMap(set, R, E, gamma, px, R)
    const h = (2 * R) / px
    let max = 0
    for (const v of map) max = Math.max(max, v)
    let worst = 0
    for (let r = 0; r < px; r += 3) {
      for (let c = 0; c < px; c += 3) {
        const direct = corralLdos(set, R, Math.hypot(-R + (c + 0.5) * h, -R + (r + 0.5) * h), E, gamma)
        worst = Math.max(worst, Math.abs(map[r * px + c]! - direct) / max)
      }
    }
    // radial Hermite interpolation: error below 1e-8 of the map maximum (measured 3e-10 here)
    expect(worst).toBeLessThan(1e-8)
    // pixel sum × pixel area ≈ ∫ρ dA (midpoint rule; the LDOS has a kink at the wall)
    const total = map.reduce((s, v) => s + v, 0) * h * h
    const rule = set.reduce((s, l) => s + l.degeneracy * lorentzian(E - l.E_eV, gamma), 0)
    expect(Math.abs(total - rule) / rule).toBeLessThan(2e-3)
  })

  it('has the Lorentzian line shape at the centre near an isolated m = 0 level', () => {
    // only m = 0 states are non-zero at r = 0 (J_m(0) = 0 for m ≥ 1), so with tiny Γ the centre
    // spectrum at E01 is 1/(πR²J1(j01)²)·L(0) plus far tails
    const set = corralModes(corralLevels({ ...CU, maxE_eV: 0 }), R)
    const g = 1e-4
    const s = corralSpectrum(set, R, 0, [set[0]!.E_eV], g)[0]!
    const j01 = 2.4048255577
    const peak = 1 / (Math.PI * R * R * BESSEL.besselj(j01, 1) ** 2) / (Math.PI * g)
    expect(Math.abs(s - peak) / peak).toBeLessThan(1e-3)
  })
})

describe('computeCorral (API contract)', () => {
  const base = { shape: 'circle', ...CU }

  it('returns levels only, when neither broadening nor a map is asked for', () => {
    const out = computeCorral({ ...base, levels: 5 })
    expect(out.levels).toHaveLength(5)
    expect(out.spectrum).toBeUndefined()
    expect(out.map).toBeUndefined()
    expect(out.levels[0]).toMatchObject({ m: 0, n: 1, degeneracy: 1 })
  })

  it('returns a spectrum at the point (default centre) when broadening_eV is given', () => {
    const a = computeCorral({ ...base, broadening_eV: 0.01, spectrum_points: 51 })
    const b = computeCorral({ ...base, broadening_eV: 0.01, spectrum_points: 51, point: [0, 0] })
    expect(a.spectrum!.E_eV).toHaveLength(51)
    expect(a.spectrum!.E_eV[0]).toBeCloseTo(-0.54, 12)
    expect(a.spectrum!.E_eV[50]).toBeCloseTo(0.16, 12)
    expect(a.spectrum!.ldos).toEqual(b.spectrum!.ldos)
    // ldos is in units of ρ∞ = m*/(2πħ²)
    const abs = corralSpectrum(corralModes(corralLevels({ ...CU, maxE_eV: 0.16 + 1 }), 7.13), 7.13, 0, [a.spectrum!.E_eV[20]!], 0.01)[0]!
    expect(a.spectrum!.ldos[20]! * cleanDos2D_per_eVnm2(0.38)).toBeCloseTo(abs, 8)
  })

  it('returns a px × px map over [−R, R]² at bias_V', () => {
    const out = computeCorral({ ...base, broadening_eV: 0.01, bias_V: 0, map_px: 32 })
    expect(out.map!.px).toBe(32)
    expect(out.map!.ldos).toHaveLength(32 * 32)
    expect(out.map!.extent_nm).toEqual([-7.13, 7.13, -7.13, 7.13])
    // corner pixels lie outside the wall
    expect(out.map!.ldos[0]).toBe(0)
    // radial symmetry: the four pixels around the centre are equal
    const c = out.map!.ldos
    expect(c[15 * 32 + 15]).toBeCloseTo(c[16 * 32 + 16]!, 12)
    expect(c[15 * 32 + 16]).toBeCloseTo(c[16 * 32 + 15]!, 12)
  })

  it('shrinks the wall by inset_nm', () => {
    const out = computeCorral({ ...base, inset_nm: 0.13, levels: 1 })
    expect(out.radius_eff_nm).toBeCloseTo(7.0, 12)
    expect(out.levels[0]!.E_eV).toBeCloseTo(-0.44 + (HBAR2_2ME_eVnm2 / 0.38) * (2.4048255577 / 7.0) ** 2, 9)
  })

  it('warns (not fails) for a bias outside the preset range, and for a map without broadening', () => {
    const out = computeCorral({ ...base, bias_V: 2, map_px: 8, preset: 'Cu(111)-tunnelling' })
    expect(out.warnings.some(w => w.includes('outside'))).toBe(true)
    expect(out.warnings.some(w => w.includes('no broadening_eV'))).toBe(true)
    expect(out.map).toBeDefined()
  })

  it('rejects bad input with an InputError naming the field', () => {
    expect(inputError(() => computeCorral({ ...base, radius_nm: 0 })).field).toBe('radius_nm')
    expect(inputError(() => computeCorral({ ...base, radius_nm: -3 })).field).toBe('radius_nm')
    expect(inputError(() => computeCorral({ ...base, m_eff: 0 })).field).toBe('m_eff')
    expect(inputError(() => computeCorral({ ...base, broadening_eV: 0 })).field).toBe('broadening_eV')
    expect(inputError(() => computeCorral({ ...base, bias_V: 0, map_px: 513 })).field).toBe('map_px')
    expect(inputError(() => computeCorral({ ...base, levels: 501 })).field).toBe('levels')
    expect(inputError(() => computeCorral({ ...base, inset_nm: 7.13 })).field).toBe('inset_nm')
    expect(inputError(() => computeCorral({ ...base, shape: 'square' })).field).toBe('shape')
    expect(inputError(() => computeCorral({ ...base, point: [0, Number.NaN], broadening_eV: 0.1 })).field).toBe('point')
    expect(inputError(() => computeCorral({ ...base, spectrum_range_eV: [0.2, 0.1], broadening_eV: 0.1 })).field).toBe('spectrum_range_eV')
  })
})
