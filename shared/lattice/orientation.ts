// Lattice orientation from the 2-D power spectrum of an atomic-resolution topograph: plane
// leveling, Hann window, FFT, first-order Bragg peaks located to sub-bin accuracy by a parabola
// through log-power (Gaussian peak interpolation), then the rotation of the real-space cell.
import { InputError } from '../errors'
import { fft2, nextPowerOfTwo } from './fft'

export interface BraggPeak { fx: number, fy: number, power: number, angle_deg: number }

export interface FFTOrientation {
  /** Rotation of the ideal cell (a1 along +x) in the scan, within the symmetry range. */
  rotation_deg: number
  /** Apparent nearest-neighbour distance along the close-packed rows, nm. */
  spacing_nm: number
  /** 1/|k| of the first-order peaks, nm (the spacing of atomic rows). */
  row_spacing_nm: number
  symmetry: 'hex' | 'square' | 'rect' | 'other'
  peaks: BraggPeak[]
}

export interface FFTOrientationOptions {
  face?: '111' | '100' | '110'
  /** Band of atomic row spacings searched, nm; default 0.1–1.0. */
  minRowSpacing_nm?: number
  maxRowSpacing_nm?: number
}

function wrap(a: number, period: number): number {
  let w = a - period * Math.round(a / period)
  if (w <= -period / 2) w += period
  return w
}

function circularMean(angles: number[], period: number): number {
  let c = 0, s = 0
  for (const a of angles) {
    c += Math.cos(2 * Math.PI * a / period)
    s += Math.sin(2 * Math.PI * a / period)
  }
  return wrap(Math.atan2(s, c) * period / (2 * Math.PI), period)
}

export function orientationFromFFT(heights: Float32Array | Float64Array, width: number, height: number,
  pixel_nm: number | [number, number], opts: FFTOrientationOptions = {}): FFTOrientation {
  if (!Number.isInteger(width) || width < 16) throw new InputError('width', 'width must be an integer ≥ 16 pixels')
  if (!Number.isInteger(height) || height < 16) throw new InputError('height', 'height must be an integer ≥ 16 pixels')
  if (width * height > 4096 * 4096) throw new InputError('width', 'image is larger than 4096 × 4096 pixels')
  if (heights.length !== width * height) throw new InputError('heights', `expected ${width * height} values, got ${heights.length}`)
  const [px, py] = typeof pixel_nm === 'number' ? [pixel_nm, pixel_nm] : pixel_nm
  if (!(px! > 0) || !(py! > 0) || !Number.isFinite(px) || !Number.isFinite(py)) throw new InputError('pixel_nm', 'pixel size must be a positive number of nm')
  for (let k = 0; k < heights.length; k++) if (!Number.isFinite(heights[k]!)) throw new InputError(`heights[${k}]`, 'height values must be finite numbers')

  // Plane leveling by least squares on centred pixel coordinates (the normal equations decouple).
  const cc = (width - 1) / 2, rc = (height - 1) / 2
  let sz = 0, szc = 0, szr = 0, scc = 0, srr = 0
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      const z = heights[r * width + c]!
      sz += z
      szc += z * (c - cc)
      szr += z * (r - rc)
      scc += (c - cc) ** 2
      srr += (r - rc) ** 2
    }
  }
  const z0 = sz / (width * height), gc = szc / scc, gr = szr / srr
  const nx = nextPowerOfTwo(width), ny = nextPowerOfTwo(height)
  const re = new Float64Array(nx * ny)
  const im = new Float64Array(nx * ny)
  for (let r = 0; r < height; r++) {
    const wr = 0.5 - 0.5 * Math.cos(2 * Math.PI * (r + 0.5) / height)
    for (let c = 0; c < width; c++) {
      const wc = 0.5 - 0.5 * Math.cos(2 * Math.PI * (c + 0.5) / width)
      re[r * nx + c] = (heights[r * width + c]! - z0 - gc * (c - cc) - gr * (r - rc)) * wr * wc
    }
  }
  fft2(re, im, nx, ny)
  const P = new Float64Array(nx * ny)
  for (let k = 0; k < P.length; k++) P[k] = re[k]! ** 2 + im[k]! ** 2
  const freqX = (kx: number) => (kx < nx / 2 ? kx : kx - nx) / (nx * px!)
  const freqY = (ky: number) => (ky < ny / 2 ? ky : ky - ny) / (ny * py!)
  const fLo = Math.max(1 / (opts.maxRowSpacing_nm ?? 1.0), 3 / Math.min(nx * px!, ny * py!))
  const fHi = 1 / (opts.minRowSpacing_nm ?? 0.1)
  const inBand = (kx: number, ky: number) => {
    const f = Math.hypot(freqX(kx), freqY(ky))
    return f >= fLo && f <= fHi && Math.abs(kx - nx / 2) > 1 && Math.abs(ky - ny / 2) > 1
  }
  let pmax = 0, kmax = -1
  for (let ky = 0; ky < ny; ky++) for (let kx = 0; kx < nx; kx++) {
    if (P[ky * nx + kx]! > pmax && inBand(kx, ky)) {
      pmax = P[ky * nx + kx]!
      kmax = ky * nx + kx
    }
  }
  if (kmax < 0 || pmax === 0) throw new InputError('heights', 'no periodic lattice found in the image')
  const fStar = Math.hypot(freqX(kmax % nx), freqY(Math.floor(kmax / nx)))
  const at = (kx: number, ky: number) => P[((ky + ny) % ny) * nx + ((kx + nx) % nx)]!
  const peaks: BraggPeak[] = []
  for (let ky = 0; ky < ny; ky++) for (let kx = 0; kx < nx; kx++) {
    const p = P[ky * nx + kx]!
    if (p < 0.15 * pmax || !inBand(kx, ky)) continue
    const f = Math.hypot(freqX(kx), freqY(ky))
    const ratio = f / fStar
    // First-order ring, and for (110) the second first-order pair at √2 × or 1/√2 ×.
    if (!(Math.abs(ratio - 1) < 0.1 || Math.abs(ratio - Math.SQRT2) < 0.1 || Math.abs(ratio - Math.SQRT1_2) < 0.07)) continue
    let isMax = true
    for (let dy = -1; dy <= 1 && isMax; dy++) for (let dx = -1; dx <= 1; dx++) {
      if ((dx || dy) && at(kx + dx, ky + dy) > p) {
        isMax = false
        break
      }
    }
    if (!isMax) continue
    const lp = (v: number) => Math.log(Math.max(v, 1e-300))
    const sub = (m: number, c: number, q: number) => {
      const d = m - 2 * c + q
      return d < 0 ? 0.5 * (m - q) / d : 0
    }
    const ox = sub(lp(at(kx - 1, ky)), lp(p), lp(at(kx + 1, ky)))
    const oy = sub(lp(at(kx, ky - 1)), lp(p), lp(at(kx, ky + 1)))
    const fx = ((kx < nx / 2 ? kx : kx - nx) + ox) / (nx * px!)
    const fy = ((ky < ny / 2 ? ky : ky - ny) + oy) / (ny * py!)
    peaks.push({ fx, fy, power: p, angle_deg: Math.atan2(fy, fx) * 180 / Math.PI })
  }
  peaks.sort((a, b) => b.power - a.power)
  const firstRing = peaks.filter(p => Math.abs(Math.hypot(p.fx, p.fy) / fStar - 1) < 0.1)
  // Distinct directions modulo 180° (each peak appears with its mirror −k).
  const dirs: number[] = []
  for (const p of firstRing) {
    const a = ((p.angle_deg % 180) + 180) % 180
    if (!dirs.some(d => Math.abs(wrap(a - d, 180)) < 8)) dirs.push(a)
  }
  let symmetry: FFTOrientation['symmetry']
  if (opts.face) symmetry = opts.face === '111' ? 'hex' : opts.face === '100' ? 'square' : 'rect'
  else if (dirs.length === 3) symmetry = 'hex'
  else if (dirs.length === 2 && Math.abs(Math.abs(wrap(dirs[0]! - dirs[1]!, 180)) - 90) < 8) symmetry = 'square'
  else symmetry = 'other'
  const kMean = firstRing.reduce((s, p) => s + Math.hypot(p.fx, p.fy), 0) / firstRing.length
  const rowSpacing = 1 / kMean
  let rotation: number
  let spacing: number
  if (symmetry === 'hex') {
    // First-shell reciprocal vectors of the ideal (111) cell point at 30° + 60°·n.
    rotation = circularMean(firstRing.map(p => p.angle_deg - 30), 60)
    spacing = rowSpacing * 2 / Math.sqrt(3)
  }
  else if (symmetry === 'square') {
    rotation = circularMean(firstRing.map(p => p.angle_deg), 90)
    spacing = rowSpacing
  }
  else {
    // Rectangular cell: the row direction a1 is along the longer first-order k (1/d > 1/a).
    const longer = peaks.filter(p => Math.abs(Math.hypot(p.fx, p.fy) / (fStar * Math.SQRT2) - 1) < 0.07)
    const shorter = peaks.filter(p => Math.abs(Math.hypot(p.fx, p.fy) / (fStar * Math.SQRT1_2) - 1) < 0.07)
    if (longer.length > 0) {
      rotation = circularMean(longer.map(p => p.angle_deg), 180)
      spacing = 1 / (kMean * Math.SQRT2)
    }
    else if (shorter.length > 0) {
      rotation = circularMean(firstRing.map(p => p.angle_deg), 180)
      spacing = rowSpacing
    }
    else {
      rotation = circularMean(firstRing.map(p => p.angle_deg - 90), 180)
      spacing = rowSpacing
    }
  }
  return { rotation_deg: rotation, spacing_nm: spacing, row_spacing_nm: rowSpacing, symmetry, peaks }
}
