// Fixed-seed synthetic topographs: Gaussian bumps z = h·exp(−r²/2σ²), σ = FWHM/(2√(2 ln 2)), at
// known positions, plus a tilted plane, a random offset per scan line and white Gaussian noise.
// PRNG: mulberry32 (T. Ettinger's public-domain 32-bit generator); normals by Box–Muller
// (Box & Muller, Ann. Math. Stat. 29, 610 (1958)).
import { InputError } from '../errors'
import { pixelPair } from './grid'
import type { Grid, PixelSize } from './types'

export const FWHM_TO_SIGMA = 1 / (2 * Math.sqrt(2 * Math.LN2))

/** mulberry32: a small, fast, seedable generator of uniform numbers in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6D2B79F5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

/** Standard normal numbers from a uniform generator (Box–Muller, both values used). */
export function normalGenerator(uniform: () => number): () => number {
  let spare: number | null = null
  return () => {
    if (spare !== null) {
      const s = spare
      spare = null
      return s
    }
    const u = 1 - uniform() // (0, 1], keeps log finite
    const v = uniform()
    const rad = Math.sqrt(-2 * Math.log(u))
    spare = rad * Math.sin(2 * Math.PI * v)
    return rad * Math.cos(2 * Math.PI * v)
  }
}

export interface SyntheticAtom { x_nm: number, y_nm: number, height_nm: number }

export interface SyntheticOptions {
  width: number
  height: number
  pixel_nm: PixelSize
  /** Explicit adatoms; when absent, random ones at `density_per_nm2`. */
  atoms?: SyntheticAtom[]
  density_per_nm2?: number
  /** Minimum centre distance between random adatoms (default 1.5 × FWHM). */
  min_separation_nm?: number
  /** Keep random adatom centres this far inside the frame (default 0). */
  margin_nm?: number
  fwhm_nm?: number
  height_nm?: number
  /** Relative standard deviation of random adatom heights (default 0). */
  height_spread?: number
  noise_nm?: number
  /** Plane z = dz_dx·x + dz_dy·y (nm per nm) added to the scan. */
  tilt?: { dz_dx: number, dz_dy: number }
  /** Standard deviation of a random constant offset added to each scan line. */
  line_offset_nm?: number
  seed?: number
}

export interface SyntheticScan extends Grid {
  pixel_nm: [number, number]
  atoms: SyntheticAtom[]
}

export function syntheticScan(o: SyntheticOptions): SyntheticScan {
  const { width: w, height: h } = o
  if (!Number.isInteger(w) || w < 1) throw new InputError('width', 'width must be a whole number ≥ 1')
  if (!Number.isInteger(h) || h < 1) throw new InputError('height', 'height must be a whole number ≥ 1')
  const [px, py] = pixelPair(o.pixel_nm)
  const fwhm_nm = o.fwhm_nm ?? 0.8
  const sigma = fwhm_nm * FWHM_TO_SIGMA
  const uniform = mulberry32(o.seed ?? 1)
  const normal = normalGenerator(uniform)
  const atoms = o.atoms ?? randomAtoms(uniform, normal, w * px, h * py, fwhm_nm, o)
  const data = new Float32Array(w * h)
  const z = new Float64Array(w * h)
  // Separable window of ±4σ around each bump.
  const gx = new Float64Array(w)
  const gy = new Float64Array(h)
  for (const a of atoms) {
    const c0 = Math.max(0, Math.floor((a.x_nm - 4 * sigma) / px)), c1 = Math.min(w - 1, Math.ceil((a.x_nm + 4 * sigma) / px))
    const r0 = Math.max(0, Math.floor((a.y_nm - 4 * sigma) / py)), r1 = Math.min(h - 1, Math.ceil((a.y_nm + 4 * sigma) / py))
    for (let c = c0; c <= c1; c++) gx[c] = Math.exp(-(((c + 0.5) * px - a.x_nm) ** 2) / (2 * sigma * sigma))
    for (let r = r0; r <= r1; r++) gy[r] = a.height_nm * Math.exp(-(((r + 0.5) * py - a.y_nm) ** 2) / (2 * sigma * sigma))
    for (let r = r0; r <= r1; r++) {
      const base = r * w
      const yr = gy[r]!
      for (let c = c0; c <= c1; c++) z[base + c]! += yr * gx[c]!
    }
  }
  const tilt = o.tilt ?? { dz_dx: 0, dz_dy: 0 }
  const noise = o.noise_nm ?? 0
  const lineSd = o.line_offset_nm ?? 0
  for (let r = 0; r < h; r++) {
    const lineOffset = lineSd > 0 ? lineSd * normal() : 0
    const y = (r + 0.5) * py
    const base = r * w
    for (let c = 0; c < w; c++) {
      const x = (c + 0.5) * px
      data[base + c] = z[base + c]! + tilt.dz_dx * x + tilt.dz_dy * y + lineOffset + (noise > 0 ? noise * normal() : 0)
    }
  }
  return { width: w, height: h, data, pixel_nm: [px, py], atoms }
}

// Random sequential placement with a minimum distance, checked through a hash grid of cells
// one separation wide; stops after 30 failed tries per wanted adatom.
function randomAtoms(uniform: () => number, normal: () => number, W_nm: number, H_nm: number, fwhm_nm: number, o: SyntheticOptions): SyntheticAtom[] {
  const density = o.density_per_nm2 ?? 0
  const minSep = o.min_separation_nm ?? 1.5 * fwhm_nm
  const margin = o.margin_nm ?? 0
  const spanX = W_nm - 2 * margin
  const spanY = H_nm - 2 * margin
  if (density <= 0 || spanX <= 0 || spanY <= 0) return []
  const wanted = Math.round(density * W_nm * H_nm)
  const cell = Math.max(minSep, 1e-9)
  const nx = Math.ceil(W_nm / cell) + 1
  const ny = Math.ceil(H_nm / cell) + 1
  const buckets = new Map<number, SyntheticAtom[]>()
  const atoms: SyntheticAtom[] = []
  const h0 = o.height_nm ?? 0.1
  const spread = o.height_spread ?? 0
  for (let tries = 0; atoms.length < wanted && tries < 30 * wanted; tries++) {
    const x = margin + uniform() * spanX
    const y = margin + uniform() * spanY
    const cx = Math.floor(x / cell), cy = Math.floor(y / cell)
    let free = true
    for (let j = cy - 1; j <= cy + 1 && free; j++) {
      for (let i = cx - 1; i <= cx + 1 && free; i++) {
        for (const b of buckets.get(j * nx + i) ?? []) {
          if ((b.x_nm - x) ** 2 + (b.y_nm - y) ** 2 < minSep * minSep) {
            free = false
            break
          }
        }
      }
    }
    if (!free || cy >= ny) continue
    const atom = { x_nm: x, y_nm: y, height_nm: h0 * (1 + spread * normal()) }
    atoms.push(atom)
    const key = cy * nx + cx
    const list = buckets.get(key)
    if (list) list.push(atom)
    else buckets.set(key, [atom])
  }
  return atoms
}
