// Adatom detection: matched Gaussian smoothing at the expected apparent width (separable, per-axis
// pixel size, after block averaging of finely sampled scans), local maxima whose prominence over
// a local background (median of a ring around the peak) exceeds k times the robust noise (MAD of
// second differences, propagated through the filter), non-maximum suppression, and sub-pixel
// refinement by Gaussian least-squares fits on the unsmoothed samples, neighbours subtracted.
import { InputError } from '../errors'
import { binGrid } from './bin'
import { gaussianKernel, smoothSeparable, type Kernel } from './gaussian'
import { checkGrid, findNonFinite, pixelPair } from './grid'
import { levelInPlace } from './level'
import { noiseSigmaRows } from './noise'
import { findPeaks, sortedMedian, suppressNonMaxima } from './peaks'
import { refinePeaks } from './refine'
import { FWHM_TO_SIGMA } from './synthetic'
import type { PixelSize } from './types'

export interface DetectParams {
  width: number
  height: number
  /** Row-major heights in nm, row 0 at the top. */
  data: ArrayLike<number>
  /** Pixel (c, r) has its centre at ((c + 0.5)·px, (r + 0.5)·py) nm. */
  pixel_nm: PixelSize
  /** Expected apparent full width at half maximum of an adatom (default 0.8 nm). */
  fwhm_nm?: number
  /** Smallest apparent height reported (default 0.03 nm). */
  min_height_nm?: number
  /** Threshold: prominence ≥ k·(noise after smoothing) (default 6). */
  threshold_k?: number
  /** Two marks closer than this keep only the stronger one (default fwhm_nm). */
  min_separation_nm?: number
  /** Remove line offsets (median of line differences) and a plane first (default true). */
  level?: boolean
  /** Keep at most this many marks, strongest first (default 100000). */
  max_marks?: number
  /** Block averaging before smoothing: 'auto' (blocks of about one σ) or [bx, by]. */
  binning?: 'auto' | readonly [number, number]
}

export interface Mark { x_nm: number, y_nm: number, height_nm: number, score: number }

export interface DetectResult {
  /** Strongest first. score = prominence / noise of the smoothed scan. */
  marks: Mark[]
  /** Estimated white-noise level of the input (nm). */
  noise_nm: number
  /** Block averaging used before smoothing, [bx, by] (1 = none). */
  binning: [number, number]
}

export const DETECT_DEFAULTS = { fwhm_nm: 0.8, min_height_nm: 0.03, threshold_k: 6 } as const

const RING_SAMPLES = 24
/** Ring radius for the local background, in σ of the smoothed peak (its tail there: 4 %). */
const RING_SIGMAS = 2.5

export function detectAdatoms(p: DetectParams): DetectResult {
  checkGrid(p)
  const [px, py] = pixelPair(p.pixel_nm)
  const fwhm_nm = positive(p.fwhm_nm ?? DETECT_DEFAULTS.fwhm_nm, 'fwhm_nm')
  const min_height_nm = nonNegative(p.min_height_nm ?? DETECT_DEFAULTS.min_height_nm, 'min_height_nm')
  const k = positive(p.threshold_k ?? DETECT_DEFAULTS.threshold_k, 'threshold_k')
  const minSep = nonNegative(p.min_separation_nm ?? fwhm_nm, 'min_separation_nm')
  const maxMarks = p.max_marks ?? 100000
  if (!Number.isInteger(maxMarks) || maxMarks < 0) throw new InputError('max_marks', 'max_marks must be a whole number ≥ 0')
  const { width: w, height: h, data } = p
  const bad = findNonFinite(data)
  if (bad >= 0) throw new InputError(`data[${bad}]`, `data[${bad}] (row ${Math.floor(bad / w)}, column ${bad % w}) is not a finite number`)
  const sigma_nm = fwhm_nm * FWHM_TO_SIGMA
  const [bx, by] = chooseBinning(p.binning, sigma_nm, px, py, w, h)
  const noise_nm = noiseSigmaRows(data, w, h)
  if (w < 3 || h < 3) return { marks: [], noise_nm, binning: [bx, by] }

  // binGrid always returns a fresh array, so it may be leveled in place.
  const grid = binGrid(data, w, h, bx, by)
  if (p.level ?? true) levelInPlace(grid.data, grid.width, grid.height)
  const { width: wb, height: hb } = grid
  const sxNm = bx * px, syNm = by * py
  // A block of b samples has variance (b² − 1)/12; the Gaussian kernel supplies the rest of σ².
  const kx = gaussianKernel(residualSigma(sigma_nm / px, bx))
  const ky = gaussianKernel(residualSigma(sigma_nm / py, by))
  const S = smoothSeparable(grid.data, wb, hb, kx, ky)
  const noiseS = Math.max(noise_nm * Math.sqrt((kx.sumSquares * ky.sumSquares) / (bx * by)), 1e-12)

  // Response of this pipeline to a unit Gaussian adatom: peak minus ring median.
  const R0 = axisResponse(kx, bx, px, sigma_nm) * axisResponse(ky, by, py, sigma_nm)
  const stx2 = sigma_nm ** 2 + ((bx * bx - 1) / 12 + kx.variance_px2 * bx * bx) * px * px
  const sty2 = sigma_nm ** 2 + ((by * by - 1) / 12 + ky.variance_px2 * by * by) * py * py
  const ring_nm = RING_SIGMAS * Math.sqrt((stx2 + sty2) / 2)
  const ringDx = new Int32Array(RING_SAMPLES)
  const ringDy = new Int32Array(RING_SAMPLES)
  const tail = new Float64Array(RING_SAMPLES)
  for (let i = 0; i < RING_SAMPLES; i++) {
    const t = (2 * Math.PI * i) / RING_SAMPLES
    const ex = ring_nm * Math.cos(t), ey = ring_nm * Math.sin(t)
    ringDx[i] = Math.round(ex / sxNm)
    ringDy[i] = Math.round(ey / syNm)
    tail[i] = Math.exp(-(ex * ex) / (2 * stx2) - (ey * ey) / (2 * sty2))
  }
  const unitProminence = R0 * (1 - sortedMedian(tail))

  // Candidates pass on the smoothed prominence; the height limit is applied to the fitted height
  // below, with a 20 % allowance here for the difference between the two estimates.
  const peaks = findPeaks(S, wb, hb, ringDx, ringDy, Math.max(k * noiseS, 0.8 * min_height_nm * unitProminence))
  const kept = suppressNonMaxima(peaks, sxNm, syNm, minSep, wb, hb)
  // Unsmoothed block means of a Gaussian adatom are close to a Gaussian of variance
  // σ² + (b² − 1)/12 px² per axis with the same volume.
  const sbx_nm = Math.sqrt(sigma_nm ** 2 + ((bx * bx - 1) / 12) * px * px)
  const sby_nm = Math.sqrt(sigma_nm ** 2 + ((by * by - 1) / 12) * py * py)
  const amplitudeToHeight = (sbx_nm * sby_nm) / (sigma_nm * sigma_nm)
  const fits = refinePeaks(grid.data, wb, hb, kept.map(i => peaks.x[i]!), kept.map(i => peaks.y[i]!), sbx_nm / sxNm, sby_nm / syNm)
  const marks: Mark[] = []
  for (let j = 0; j < kept.length && marks.length < maxMarks; j++) {
    const i = kept[j]!
    const fit = fits[j]
    const xb = fit ? fit.x0 : peaks.x[i]!
    const yb = fit ? fit.y0 : peaks.y[i]!
    const height_nm = fit ? fit.A * amplitudeToHeight : peaks.prom[i]! / unitProminence
    if (height_nm < min_height_nm) continue
    // Block (C, R) is centred at ((C + 0.5)·b·px, (R + 0.5)·b·py) nm.
    marks.push({ x_nm: (xb + 0.5) * sxNm, y_nm: (yb + 0.5) * syNm, height_nm, score: peaks.prom[i]! / noiseS })
  }
  return { marks, noise_nm, binning: [bx, by] }
}

// Blocks of about one σ keep the smoothed peak ≥ 1.5 samples wide, as the three-point estimate
// needs, while cutting the work for finely sampled scans by bx·by.
function chooseBinning(binning: DetectParams['binning'], sigma_nm: number, px: number, py: number, w: number, h: number): [number, number] {
  let want: readonly [number, number]
  if (binning === undefined || binning === 'auto') want = [Math.floor(sigma_nm / px), Math.floor(sigma_nm / py)]
  else {
    if (!Array.isArray(binning) || binning.length !== 2 || !binning.every(b => Number.isInteger(b) && b >= 1)) {
      throw new InputError('binning', 'binning must be "auto" or two whole numbers ≥ 1')
    }
    want = binning
  }
  return [Math.max(1, Math.min(want[0], Math.floor(w / 3))), Math.max(1, Math.min(want[1], Math.floor(h / 3)))]
}

// Peak response along one axis to a unit Gaussian of σ (nm) centred on a block: block mean of
// the samples, then the residual kernel.
function axisResponse(k: Kernel, b: number, pixel: number, sigma: number): number {
  let s = 0
  for (let i = -k.radius; i <= k.radius; i++) {
    let box = 0
    for (let j = 0; j < b; j++) {
      const x = (i * b + j - (b - 1) / 2) * pixel
      box += Math.exp(-(x * x) / (2 * sigma * sigma))
    }
    s += k.weights[Math.abs(i)]! * (box / b)
  }
  return s
}

function residualSigma(sigma_px: number, b: number): number {
  return Math.max(Math.sqrt(Math.max(sigma_px * sigma_px - (b * b - 1) / 12, 0)) / b, 0.3)
}

function positive(v: number, field: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new InputError(field, `${field} must be a finite number greater than 0`)
  return v
}

function nonNegative(v: number, field: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) throw new InputError(field, `${field} must be a finite number ≥ 0`)
  return v
}
