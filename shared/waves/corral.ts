// Hard-wall circular corral (particle in a circle of radius R): E_{m,n} = E0 + (ħ²/2m*)(j_{m,n}/R)²,
// ψ = J_m(j_{m,n} r/R)·e^{imθ} / (√π·R·|J_{m+1}(j_{m,n})|), and the LDOS
// ρ(r, E) = Σ_{m,n} Σ_{±m} |ψ|² · L_Γ(E − E_{m,n}), L_Γ(ε) = (Γ/π)/(ε² + Γ²) with Γ the HWHM.
import { besselJPair } from './bessel'
import { besselJZeros } from './bessel-zeros'
import { kineticPrefactor_eVnm2 } from './constants'

export interface CorralLevel {
  m: number
  n: number
  /** j_{m,n}, the n-th zero of J_m */
  j: number
  E_eV: number
  /** 1 for m = 0, 2 for m ≥ 1 (±m); spin not counted */
  degeneracy: 1 | 2
}

/** A level with the normalisation of its density: Σ_{±m}|ψ|²(r) = weight · J_m(j r/R)². */
export interface CorralMode extends CorralLevel {
  /** degeneracy / (π R² J_{m+1}(j)²), in 1/nm² */
  weight_per_nm2: number
}

/** Lorentzian L_Γ(ε) = (Γ/π)/(ε² + Γ²), 1/eV, area 1, half width at half maximum Γ (eV). */
export function lorentzian(dE_eV: number, hwhm_eV: number): number {
  return hwhm_eV / (Math.PI * (dE_eV * dE_eV + hwhm_eV * hwhm_eV))
}

/** All levels with j_{m,n} ≤ jMax, sorted by energy (then m, n). */
function levelsBelowJ(radius_nm: number, E0_eV: number, m_eff: number, jMax: number): CorralLevel[] {
  const pref = kineticPrefactor_eVnm2(m_eff) / (radius_nm * radius_nm)
  const out: CorralLevel[] = []
  for (let m = 0; m <= jMax; m++) {
    const zeros = besselJZeros(m, { below: jMax })
    if (zeros.length === 0) break // j_{m,1} increases with m: no higher order has a zero either
    zeros.forEach((j, i) => out.push({ m, n: i + 1, j, E_eV: E0_eV + pref * j * j, degeneracy: m === 0 ? 1 : 2 }))
  }
  out.sort((a, b) => a.j - b.j || a.m - b.m || a.n - b.n)
  return out
}

/**
 * Hard-wall levels of a disk of radius `radius_nm` (the effective radius): the lowest `count`, or
 * all with E ≤ maxE_eV. m ≥ 0; the ±m pair is one level of degeneracy 2.
 */
export function corralLevels(opts: { radius_nm: number, E0_eV: number, m_eff: number, count?: number, maxE_eV?: number }): CorralLevel[] {
  const { radius_nm, E0_eV, m_eff } = opts
  if (opts.maxE_eV !== undefined) {
    if (opts.maxE_eV <= E0_eV) return []
    const jMax = radius_nm * Math.sqrt((opts.maxE_eV - E0_eV) / kineticPrefactor_eVnm2(m_eff))
    const all = levelsBelowJ(radius_nm, E0_eV, m_eff, jMax)
    return opts.count === undefined ? all : all.slice(0, opts.count)
  }
  const count = opts.count ?? 20
  // Weyl's law for a hard disk: (jR)²/4 − jR/2 orbitals below j, about half as many levels,
  // so j ≈ 1 + √(1 + 8·count) holds `count` levels; widen until it does.
  let jMax = 2 + Math.sqrt(1 + 8 * count)
  for (;;) {
    const all = levelsBelowJ(radius_nm, E0_eV, m_eff, jMax)
    if (all.length >= count) return all.slice(0, count)
    jMax *= 1.3
  }
}

const pair = new Float64Array(2)

/** Attaches the density normalisation ∫_disk Σ_{±m}|ψ|² dA = degeneracy, using
 * ∫₀^R J_m(j r/R)² r dr = (R²/2)·J_{m+1}(j)² at a zero j of J_m (DLMF 10.22.37). */
export function corralModes(levels: readonly CorralLevel[], radius_nm: number): CorralMode[] {
  return levels.map((l) => {
    besselJPair(l.m, l.j, pair)
    const jp = pair[1]!
    return { ...l, weight_per_nm2: l.degeneracy / (Math.PI * radius_nm * radius_nm * jp * jp) }
  })
}

/** Σ_{±m}|ψ_{m,n}|² at distance r_nm from the centre, 1/nm² (0 outside the wall). */
export function modeDensity(mode: CorralMode, radius_nm: number, r_nm: number): number {
  if (r_nm >= radius_nm) return 0
  besselJPair(mode.m, (mode.j * r_nm) / radius_nm, pair)
  const v = pair[0]!
  return mode.weight_per_nm2 * v * v
}

/** LDOS ρ(r, E) in 1/(eV·nm²) per spin, summed over the given modes. */
export function corralLdos(modes: readonly CorralMode[], radius_nm: number, r_nm: number, E_eV: number, hwhm_eV: number): number {
  let s = 0
  for (const md of modes) s += modeDensity(md, radius_nm, r_nm) * lorentzian(E_eV - md.E_eV, hwhm_eV)
  return s
}

/** Point spectrum ρ(r, E_i) for each energy, 1/(eV·nm²): densities once, then Lorentzian sums. */
export function corralSpectrum(modes: readonly CorralMode[], radius_nm: number, r_nm: number, energies_eV: ArrayLike<number>, hwhm_eV: number): Float64Array {
  const dens = modes.map(md => modeDensity(md, radius_nm, r_nm))
  const out = new Float64Array(energies_eV.length)
  for (let i = 0; i < out.length; i++) {
    const E = energies_eV[i]!
    let s = 0
    for (let l = 0; l < modes.length; l++) s += dens[l]! * lorentzian(E - modes[l]!.E_eV, hwhm_eV)
    out[i] = s
  }
  return out
}

/**
 * LDOS map at energy E on a px × px grid over [−half, half]², 1/(eV·nm²), row-major with row r,
 * column c at (−half + (c+½)h, −half + (r+½)h), h = 2·half/px. The LDOS of a disk is radial, so it
 * is evaluated exactly with its derivative on a radial grid (spacing ≤ 0.025/k_max, ≥ 256 nodes)
 * and interpolated by cubic Hermite polynomials (error ∝ (2kΔr)⁴/384: measured ≲ 3e-9 of the
 * map maximum, ≲ 3e-8 relative wherever the LDOS exceeds 5 % of it).
 */
export function corralMap(modes: readonly CorralMode[], radius_nm: number, E_eV: number, hwhm_eV: number, px: number, half_nm: number): Float64Array {
  const R = radius_nm
  let jTop = 1
  for (const md of modes) jTop = Math.max(jTop, md.j)
  const nodes = Math.max(256, Math.ceil(jTop / 0.025)) + 1
  const dr = R / (nodes - 1)
  const f = new Float64Array(nodes)
  const df = new Float64Array(nodes)
  const w = modes.map(md => md.weight_per_nm2 * lorentzian(E_eV - md.E_eV, hwhm_eV))
  for (let l = 0; l < modes.length; l++) {
    const md = modes[l]!
    const k = md.j / R
    const wl = w[l]!
    for (let i = 0; i < nodes; i++) {
      const x = k * i * dr
      besselJPair(md.m, x, pair)
      const J = pair[0]!
      // d/dr J_m(kr)² = 2 J_m · k·J_m'(kr), J_m'(x) = (m/x)J_m − J_{m+1}; at r = 0 it vanishes
      // for every m (J_m(0) = 0 for m ≥ 1, J_0'(0) = 0)
      const Jp = x === 0 ? 0 : (md.m / x) * J - pair[1]!
      f[i] = f[i]! + wl * J * J
      df[i] = df[i]! + wl * 2 * J * k * Jp
    }
  }
  const out = new Float64Array(px * px)
  const h = (2 * half_nm) / px
  for (let r = 0; r < px; r++) {
    const y = -half_nm + (r + 0.5) * h
    for (let c = 0; c < px; c++) {
      const x = -half_nm + (c + 0.5) * h
      const rr = Math.sqrt(x * x + y * y)
      if (rr >= R) continue
      const t = rr / dr
      const i = Math.min(nodes - 2, Math.floor(t))
      const s = t - i
      const s2 = s * s
      const s3 = s2 * s
      out[r * px + c] = (2 * s3 - 3 * s2 + 1) * f[i]! + (s3 - 2 * s2 + s) * dr * df[i]!
        + (-2 * s3 + 3 * s2) * f[i + 1]! + (s3 - s2) * dr * df[i + 1]!
    }
  }
  return out
}
