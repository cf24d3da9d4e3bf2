// 1-D hard-wall box for atomic chains: E_n = E0 + ħ²π²n²/(2m*L²), ψ_n(x) = √(2/L)·sin(nπx/L) on
// [0, L], LDOS ρ(x, E) = Σ_n |ψ_n(x)|² L_Γ(E − E_n) per spin, in 1/(eV·nm).
import { kineticPrefactor_eVnm2 } from './constants'
import { lorentzian } from './corral'

/**
 * Effective box length of an N-atom chain with spacing a: 'N·a' puts the walls half a spacing
 * outside the end atoms; '(N+1)·a' puts them one full spacing outside (the walls sit on the
 * first missing atom on each side); 'custom' takes L_nm as given. The choice moves every level,
 * so it is always explicit.
 */
export type BoxLengthConvention = 'N·a' | '(N+1)·a' | 'custom'

export interface BoxGeometry {
  convention: BoxLengthConvention
  atoms?: number
  spacing_nm?: number
  L_nm?: number
}

/** Box length in nm for the chosen convention; also the x of atom i (0-based) inside [0, L]. */
export function boxLength(g: BoxGeometry): number {
  if (g.convention === 'custom') return g.L_nm ?? Number.NaN
  const N = g.atoms ?? Number.NaN
  const a = g.spacing_nm ?? Number.NaN
  return g.convention === 'N·a' ? N * a : (N + 1) * a
}

/** Position of chain atom i (0-based) measured from the left wall, nm (centred chain). */
export function atomPosition_nm(g: BoxGeometry, i: number): number {
  const L = boxLength(g)
  const N = g.atoms ?? 1
  const a = g.spacing_nm ?? L / N
  return L / 2 + (i - (N - 1) / 2) * a
}

export interface BoxLevel { n: number, E_eV: number }

/** Levels E_n = E0 + (ħ²/2m*)(nπ/L)², n = 1, 2, …: the lowest `count`, or all with E ≤ maxE_eV. */
export function boxLevels(opts: { L_nm: number, E0_eV: number, m_eff: number, count?: number, maxE_eV?: number }): BoxLevel[] {
  const pref = kineticPrefactor_eVnm2(opts.m_eff) * (Math.PI / opts.L_nm) ** 2
  let nMax = opts.count ?? 10
  if (opts.maxE_eV !== undefined) {
    nMax = opts.maxE_eV <= opts.E0_eV ? 0 : Math.floor(Math.sqrt((opts.maxE_eV - opts.E0_eV) / pref))
    if (opts.count !== undefined) nMax = Math.min(nMax, opts.count)
  }
  const out: BoxLevel[] = []
  for (let n = 1; n <= nMax; n++) out.push({ n, E_eV: opts.E0_eV + pref * n * n })
  return out
}

/** |ψ_n(x)|² = (2/L)·sin²(nπx/L) for 0 ≤ x ≤ L, else 0; 1/nm. */
export function boxDensity(n: number, L_nm: number, x_nm: number): number {
  if (x_nm <= 0 || x_nm >= L_nm) return 0
  const s = Math.sin((n * Math.PI * x_nm) / L_nm)
  return (2 / L_nm) * s * s
}

/** LDOS ρ(x_i, E) along the box at one energy, 1/(eV·nm). */
export function boxLdosLine(levels: readonly BoxLevel[], L_nm: number, x_nm: ArrayLike<number>, E_eV: number, hwhm_eV: number): Float64Array {
  const out = new Float64Array(x_nm.length)
  for (const lv of levels) {
    const w = lorentzian(E_eV - lv.E_eV, hwhm_eV)
    for (let i = 0; i < out.length; i++) out[i] = out[i]! + w * boxDensity(lv.n, L_nm, x_nm[i]!)
  }
  return out
}

/** Point spectrum ρ(x, E_i), 1/(eV·nm). */
export function boxSpectrum(levels: readonly BoxLevel[], L_nm: number, x_nm: number, energies_eV: ArrayLike<number>, hwhm_eV: number): Float64Array {
  const dens = levels.map(lv => boxDensity(lv.n, L_nm, x_nm))
  const out = new Float64Array(energies_eV.length)
  for (let i = 0; i < out.length; i++) {
    let s = 0
    for (let l = 0; l < levels.length; l++) s += dens[l]! * lorentzian(energies_eV[i]! - levels[l]!.E_eV, hwhm_eV)
    out[i] = s
  }
  return out
}
