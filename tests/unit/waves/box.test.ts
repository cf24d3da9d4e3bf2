import { describe, expect, it } from 'vitest'
import { atomPosition_nm, boxDensity, boxLdosLine, boxLength, boxLevels, boxSpectrum } from '../../../shared/waves/box'
import { computeBox } from '../../../shared/waves/compute-box'
import { lorentzian } from '../../../shared/waves/corral'
import { isInputError } from '../../../shared/errors'
import { integrate } from './quadrature'

// Published chain: Au on NiAl(110), spacing 2.89 Å (Nilius, Wallis, Ho, Science 297, 1853 (2002));
// m* ≈ 0.5 (Nilius et al., J. Phys. Chem. C 2014; from memory). E0 = 0 here: only differences matter.
const A = 0.289
const HB = 0.0380998 // ħ²/(2 m_e), eV·nm² (derived from CODATA)

describe('1-D box for chains', () => {
  it('makes the effective length an explicit convention', () => {
    expect(boxLength({ convention: 'N·a', atoms: 10, spacing_nm: A })).toBeCloseTo(2.89, 12)
    expect(boxLength({ convention: '(N+1)·a', atoms: 10, spacing_nm: A })).toBeCloseTo(3.179, 12)
    expect(boxLength({ convention: 'custom', L_nm: 3 })).toBe(3)
    // atoms centred: with (N+1)·a the walls sit one spacing beyond the end atoms
    expect(atomPosition_nm({ convention: '(N+1)·a', atoms: 10, spacing_nm: A }, 0)).toBeCloseTo(A, 12)
    expect(atomPosition_nm({ convention: 'N·a', atoms: 10, spacing_nm: A }, 9)).toBeCloseTo(9.5 * A, 12)
  })

  it('gives E_n = E0 + ħ²π²n²/(2m*L²) (closed form, any textbook)', () => {
    for (const L of [2.89, 3.179, 5.78]) {
      const lv = boxLevels({ L_nm: L, E0_eV: -0.1, m_eff: 0.5, count: 6 })
      // relative 2e-6: HB carries 6 significant digits
      lv.forEach((l, i) => {
        const dE = (HB / 0.5) * ((i + 1) * Math.PI / L) ** 2
        expect(Math.abs(l.E_eV + 0.1 - dE) / dE).toBeLessThan(2e-6)
      })
    }
    // worked number: N = 10, L = N·a = 2.89 nm, m* = 0.5 → E1 − E0 = 0.0762·(π/2.89)² ≈ 0.0900 eV
    expect(boxLevels({ L_nm: 2.89, E0_eV: 0, m_eff: 0.5, count: 1 })[0]!.E_eV).toBeCloseTo(0.0900, 4)
    // an energy cut returns exactly the levels below it
    const cut = boxLevels({ L_nm: 2.89, E0_eV: 0, m_eff: 0.5, maxE_eV: 1 })
    expect(cut.every(l => l.E_eV <= 1)).toBe(true)
    expect((HB / 0.5) * ((cut.length + 1) * Math.PI / 2.89) ** 2).toBeGreaterThan(1)
  })

  it('has normalised, orthogonal densities |ψ_n|² = (2/L) sin²(nπx/L)', () => {
    const L = 3.179
    for (let n = 1; n <= 6; n++) {
      expect(integrate(x => boxDensity(n, L, x), 0, L)).toBeCloseTo(1, 12)
      for (let m = n + 1; m <= 6; m++) {
        // ψ_n ψ_m from the densities' square roots with sign: (2/L) sin(nπx/L) sin(mπx/L)
        const overlap = integrate(x => (2 / L) * Math.sin(n * Math.PI * x / L) * Math.sin(m * Math.PI * x / L), 0, L)
        expect(Math.abs(overlap)).toBeLessThan(1e-12)
      }
    }
    expect(boxDensity(1, L, -0.1)).toBe(0)
    expect(boxDensity(1, L, L / 2)).toBeCloseTo(2 / L, 14)
  })

  it('obeys the LDOS sum rule ∫ρ(x, E) dx = Σ_n L_Γ(E − E_n), and the spectrum matches the line', () => {
    const L = 2.89
    const lv = boxLevels({ L_nm: L, E0_eV: 0, m_eff: 0.5, maxE_eV: 3 })
    const g = 0.02
    const E = lv[1]!.E_eV
    const lhs = integrate(x => boxSpectrum(lv, L, x, [E], g)[0]!, 0, L)
    expect(lhs).toBeCloseTo(lv.reduce((s, l) => s + lorentzian(E - l.E_eV, g), 0), 10)
    const xs = [0.3, 1.1, 1.445]
    const line = boxLdosLine(lv, L, xs, E, g)
    xs.forEach((x, i) => expect(line[i]).toBeCloseTo(boxSpectrum(lv, L, x, [E], g)[0]!, 12))
    // n = 2 has a node in the middle: the centre LDOS at E2 is far below its value at L/4
    expect(boxSpectrum(lv, L, L / 2, [E], g)[0]!).toBeLessThan(0.2 * boxSpectrum(lv, L, L / 4, [E], g)[0]!)
  })
})

describe('computeBox', () => {
  it('returns levels, atom positions, spectrum and line', () => {
    const out = computeBox({ convention: '(N+1)·a', atoms: 10, spacing_nm: A, E0_eV: 0, m_eff: 0.5, broadening_eV: 0.02, bias_V: 0.3, line_px: 50 })
    expect(out.L_nm).toBeCloseTo(3.179, 12)
    expect(out.atoms_x_nm).toHaveLength(10)
    expect(out.levels).toHaveLength(10)
    expect(out.spectrum!.E_eV).toHaveLength(301)
    expect(out.line!.ldos).toHaveLength(50)
  })

  it('names the missing field for each convention', () => {
    const field = (fn: () => unknown) => {
      try {
        fn()
      }
      catch (e) {
        if (isInputError(e)) return e.field
        throw e
      }
      return ''
    }
    expect(field(() => computeBox({ convention: 'N·a', spacing_nm: A, E0_eV: 0, m_eff: 0.5 }))).toBe('atoms')
    expect(field(() => computeBox({ convention: '(N+1)·a', atoms: 3, E0_eV: 0, m_eff: 0.5 }))).toBe('spacing_nm')
    expect(field(() => computeBox({ convention: 'custom', E0_eV: 0, m_eff: 0.5 }))).toBe('L_nm')
    expect(field(() => computeBox({ convention: 'N+1', atoms: 3, spacing_nm: A, E0_eV: 0, m_eff: 0.5 }))).toBe('convention')
    expect(field(() => computeBox({ convention: 'custom', L_nm: 3, E0_eV: 0, m_eff: 0.5, broadening_eV: 0 }))).toBe('broadening_eV')
  })
})
