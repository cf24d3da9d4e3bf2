import { describe, expect, it } from 'vitest'
import { HBAR2_2ME_eVnm2, cleanDos2D_per_eVnm2, kineticPrefactor_eVnm2 } from '../../../shared/waves/constants'

describe('physical constants', () => {
  it('derives ħ²/(2 m_e) = 0.0380998 eV·nm² from CODATA ħ, m_e and e', () => {
    // ħ²/(2 m_e) = 0.0380998 eV·nm² (derived from CODATA)
    expect(Math.abs(HBAR2_2ME_eVnm2 - 0.0380998)).toBeLessThan(5e-8)
  })

  it('gives the free-electron 2-D DOS m*/(2πħ²) per spin', () => {
    // Common textbook result (e.g. Ashcroft & Mermin, 2-D electron gas): per spin
    // g = m*/(2πħ²); with ħ²/m_e = 2·0.0380998 eV·nm², for m* = 0.38: 0.38/(2π·0.0761996)
    expect(cleanDos2D_per_eVnm2(0.38)).toBeCloseTo(0.38 / (2 * Math.PI * 2 * 0.0380998), 5)
    expect(kineticPrefactor_eVnm2(0.5)).toBeCloseTo(2 * HBAR2_2ME_eVnm2, 15)
  })
})
