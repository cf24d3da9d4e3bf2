// Input schemas (zod) of the wave preview: hard-wall corral, 1-D box for chains and s-wave
// multiple scattering. Lengths in nm, energies in eV relative to E_F, bias in V (E = e·bias).
import { z } from 'zod'
import { PRESET_IDS } from './presets'

const finite = (what: string) => z.number({ error: `${what} must be a number` })
const point = z.tuple([finite('x'), finite('y')])
const presetId = z.enum(PRESET_IDS as [string, ...string[]]).optional()
const range = z.tuple([finite('from'), finite('to')])
  .refine(r => r[0] < r[1], 'must be [from, to] with from < to')
  .refine(r => r[0] >= -10 && r[1] <= 10, 'must lie within [−10, 10] eV')

/** Limits shared by the three models (documented for the API). */
export const WAVE_LIMITS = {
  radius_nm: 50,
  levels: 500,
  map_px: 512,
  spectrum_points: 4001,
  broadening_eV: 1,
  scatterers: 400,
  chain_atoms: 1000,
  line_px: 4096,
  /** scattering map work budget px²·n² (≈ 6 s here); spectrum budget points·n³ */
  scattering_map_work: 2e9,
  scattering_spectrum_work: 4.5e9,
} as const

const common = {
  E0_eV: finite('E0_eV').min(-5, 'must be ≥ −5 eV').max(5, 'must be ≤ 5 eV'),
  m_eff: finite('m_eff').gt(0, 'must be > 0 (in units of the electron mass)').max(10, 'must be ≤ 10'),
  broadening_eV: finite('broadening_eV').gt(0, 'must be > 0 eV (half width at half maximum of the Lorentzian)')
    .max(WAVE_LIMITS.broadening_eV, `must be ≤ ${WAVE_LIMITS.broadening_eV} eV`).optional(),
  bias_V: finite('bias_V').min(-10, 'must be ≥ −10 V').max(10, 'must be ≤ 10 V').optional(),
  spectrum_range_eV: range.optional(),
  spectrum_points: z.int('must be an integer').min(2, 'must be ≥ 2').max(WAVE_LIMITS.spectrum_points, `must be ≤ ${WAVE_LIMITS.spectrum_points}`).optional(),
  preset: presetId,
}
const mapPx = z.int('must be an integer').min(2, 'must be ≥ 2').max(WAVE_LIMITS.map_px, `must be ≤ ${WAVE_LIMITS.map_px}`).optional()

/**
 * POST /api/compute/corral (API contract in the README), with added optional fields:
 *   inset_nm            wall inset: effective radius = radius_nm − inset_nm (default 0)
 *   spectrum_range_eV   [from, to] (default [E0 − 0.1, E0 + 0.6]); spectrum_points (default 301)
 *   preset              surface-state preset id, only for the bias warnings
 * Spectrum when broadening_eV is given; map when bias_V and map_px are given (a map without
 * broadening_eV uses 0.02 eV and says so in warnings).
 */
export const CorralInput = z.object({
  shape: z.literal('circle', 'only "circle" is supported'),
  radius_nm: finite('radius_nm').gt(0, 'must be > 0 nm').max(WAVE_LIMITS.radius_nm, `must be ≤ ${WAVE_LIMITS.radius_nm} nm`),
  inset_nm: finite('inset_nm').min(0, 'must be ≥ 0 nm').optional(),
  levels: z.int('must be an integer').min(1, 'must be ≥ 1').max(WAVE_LIMITS.levels, `must be ≤ ${WAVE_LIMITS.levels}`).optional(),
  map_px: mapPx,
  point: point.optional(),
  ...common,
})
export type CorralInput = z.input<typeof CorralInput>

/**
 * 1-D box for a chain (POST /api/compute/chain):
 *   convention 'N·a' | '(N+1)·a' (needs atoms, spacing_nm) | 'custom' (needs L_nm)
 *   levels (default 10), broadening_eV, bias_V, line_px (LDOS along the box at bias_V),
 *   point_nm (x from the left wall for the spectrum; default L/2)
 */
export const BoxInput = z.object({
  convention: z.enum(['N·a', '(N+1)·a', 'custom'], 'must be "N·a", "(N+1)·a" or "custom"'),
  atoms: z.int('must be an integer').min(1, 'must be ≥ 1').max(WAVE_LIMITS.chain_atoms, `must be ≤ ${WAVE_LIMITS.chain_atoms}`).optional(),
  spacing_nm: finite('spacing_nm').gt(0, 'must be > 0 nm').max(10, 'must be ≤ 10 nm').optional(),
  L_nm: finite('L_nm').gt(0, 'must be > 0 nm').max(1000, 'must be ≤ 1000 nm').optional(),
  levels: z.int('must be an integer').min(1, 'must be ≥ 1').max(WAVE_LIMITS.levels, `must be ≤ ${WAVE_LIMITS.levels}`).optional(),
  line_px: z.int('must be an integer').min(2, 'must be ≥ 2').max(WAVE_LIMITS.line_px, `must be ≤ ${WAVE_LIMITS.line_px}`).optional(),
  point_nm: finite('point_nm').optional(),
  ...common,
})
export type BoxInput = z.input<typeof BoxInput>

/**
 * POST /api/compute/scattering — contract (stateless, like the other compute routes):
 * in:  { scatterers: [[x,y],…],                 // adatom positions, nm (0…400 of them)
 *        E0_eV, m_eff,                          // surface-state band bottom and effective mass
 *        delta0?: [re, im],                     // s-wave phase shift (rad), Im ≥ 0; default: black
 *                                               // dot (Im δ0 → ∞, amplitude −½); [π/2, 0]: hard elastic
 *        broadening_eV?: number,                // HWHM Γ > 0, via complex energy E + iΓ; default none
 *        bias_V?: number, map_px?: number,      // map at E = e·bias_V when both are given
 *        extent_nm?: [xmin, xmax, ymin, ymax],  // map window; default: scatterers' bounding square + 2 nm
 *        point?: [x,y],                         // spectrum at this point (same frame as scatterers)
 *        spectrum_range_eV?: [from, to],        // default [E0 − 0.1, E0 + 0.6]
 *        spectrum_points?: number,              // default 201
 *        preset?: string }                      // only for bias warnings
 * out: { spectrum?: { E_eV: [...], ldos: [...] },
 *        map?: { px, extent_nm, ldos: [...] },  // row-major px·px, row r at ymin + (r+½)Δy
 *        amplitude: [re, im], rho0_per_eV_nm2, ldos_unit, warnings: [...] }
 * ldos is ρ/ρ∞, ρ∞ = m* / (2πħ²) = rho0_per_eV_nm2 (clean surface, per spin): → 1 far away.
 * 400 with the field named: two scatterers closer than 0.05 nm ('scatterers[i]'), nothing asked
 * for ('point'), a map or spectrum over the work budget ('map_px', 'spectrum_points').
 */
export const ScatteringInput = z.object({
  scatterers: z.array(point).max(WAVE_LIMITS.scatterers, `at most ${WAVE_LIMITS.scatterers} scatterers`),
  delta0: z.tuple([finite('Re δ0'), finite('Im δ0').min(0, 'Im δ0 must be ≥ 0 (elastic or absorbing)')]).optional(),
  map_px: mapPx,
  extent_nm: z.tuple([finite('xmin'), finite('xmax'), finite('ymin'), finite('ymax')])
    .refine(e => e[0] < e[1] && e[2] < e[3], 'must be [xmin, xmax, ymin, ymax] with min < max').optional(),
  point: point.optional(),
  ...common,
})
export type ScatteringInput = z.input<typeof ScatteringInput>
