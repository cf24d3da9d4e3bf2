// Physical constants (CODATA 2018 / SI 2019) and the free-electron kinetic prefactor
// ħ²/(2 m_e) in eV·nm², derived here from ħ, m_e and e rather than typed in.

/** Reduced Planck constant, eV·s (exact in SI since 2019: h and e are fixed). */
export const HBAR_eVs = 6.582119569e-16
/** Electron rest mass, kg (CODATA 2018, 9.1093837015e-31; often quoted as 9.1093837e-31). */
export const ELECTRON_MASS_kg = 9.1093837015e-31
/** Elementary charge, C (exact in SI since 2019); converts J to eV. */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19

/**
 * ħ²/(2 m_e) in eV·nm² = (ħ[eV·s])² · e[J/eV] / (2 m_e[kg]) · 10¹⁸ nm²/m².
 * ≈ 0.0380998 eV·nm²: with it E = (ħ²/2m_e)·k²/m* for k in nm⁻¹.
 */
export const HBAR2_2ME_eVnm2 = (HBAR_eVs * HBAR_eVs * ELEMENTARY_CHARGE_C) / (2 * ELECTRON_MASS_kg) * 1e18

/** ħ²/(2 m*) in eV·nm² for an effective mass m* = m_eff·m_e. */
export function kineticPrefactor_eVnm2(m_eff: number): number {
  return HBAR2_2ME_eVnm2 / m_eff
}

/**
 * Clean 2-D surface-state density of states per spin, m* / (2πħ²) in 1/(eV·nm²)
 * (free electrons in 2-D: constant above the band bottom). Equals 1/(4π·ħ²/2m*).
 */
export function cleanDos2D_per_eVnm2(m_eff: number): number {
  return 1 / (4 * Math.PI * kineticPrefactor_eVnm2(m_eff))
}
