import { describe, expect, it } from 'vitest'
import { fft, fft2, getSurface, orientationFromFFT } from '../../../shared/lattice'
import { expectInputError } from './helpers'
import { normal, rng } from './synthetic'

/** Textbook O(N²) DFT, X_k = Σ x_n e^{−2πi kn/N}. */
function dft(re: number[], im: number[]) {
  const n = re.length
  const R: number[] = [], I: number[] = []
  for (let k = 0; k < n; k++) {
    let sr = 0, si = 0
    for (let t = 0; t < n; t++) {
      const a = -2 * Math.PI * k * t / n
      sr += re[t]! * Math.cos(a) - im[t]! * Math.sin(a)
      si += re[t]! * Math.sin(a) + im[t]! * Math.cos(a)
    }
    R.push(sr)
    I.push(si)
  }
  return { R, I }
}

/**
 * Synthetic atomic-resolution topograph: the sum of plane waves at the first-shell reciprocal
 * vectors of the rotated surface cell (the usual model of a close-packed STM image; common
 * practice), plus Gaussian noise. Pixel (c, r) has its centre at ((c + ½)·px, (r + ½)·py).
 */
function latticeImage(surfaceId: string, rotation_deg: number, w: number, h: number, px: number, py: number, seed: number) {
  const s = getSurface(surfaceId)
  const th = rotation_deg * Math.PI / 180
  const rot = (v: readonly number[]) => [Math.cos(th) * v[0]! - Math.sin(th) * v[1]!, Math.sin(th) * v[0]! + Math.cos(th) * v[1]!]
  const a1 = rot(s.a1), a2 = rot(s.a2)
  const det = a1[0]! * a2[1]! - a1[1]! * a2[0]!
  const b1 = [a2[1]! / det, -a2[0]! / det], b2 = [-a1[1]! / det, a1[0]! / det]
  // First shell: b1, b2 and, on the hexagonal cell (b1·b2 > 0, 60° apart), b1 − b2.
  const G = [b1, b2, [b1[0]! - b2[0]!, b1[1]! - b2[1]!]]
  if (s.face !== '111') G.pop()
  const rand = rng(seed)
  const img = new Float32Array(w * h)
  for (let r = 0; r < h; r++) for (let c = 0; c < w; c++) {
    const x = (c + 0.5) * px + 0.37, y = (r + 0.5) * py - 0.21
    let z = 0.02 * x + 0.01 * y
    for (const g of G) z += 0.01 * Math.cos(2 * Math.PI * (g[0]! * x + g[1]! * y))
    img[r * w + c] = z + 0.004 * normal(rand)
  }
  return img
}

describe('FFT', () => {
  it('radix-2 transform equals the textbook DFT (N = 64)', () => {
    const rand = rng(3)
    const re = Array.from({ length: 64 }, () => rand() - 0.5)
    const im = Array.from({ length: 64 }, () => rand() - 0.5)
    const { R, I } = dft(re, im)
    const fr = Float64Array.from(re), fi = Float64Array.from(im)
    fft(fr, fi)
    for (let k = 0; k < 64; k++) {
      expect(fr[k]).toBeCloseTo(R[k]!, 10)
      expect(fi[k]).toBeCloseTo(I[k]!, 10)
    }
  })

  it('2-D transform equals row-then-column textbook DFTs (16 × 8)', () => {
    const rand = rng(4)
    const nx = 16, ny = 8
    const re = Array.from({ length: nx * ny }, () => rand())
    const fr = Float64Array.from(re), fi = new Float64Array(nx * ny)
    fft2(fr, fi, nx, ny)
    // Direct double sum for a few bins.
    for (const [kx, ky] of [[0, 0], [3, 1], [15, 7], [8, 4]] as const) {
      let sr = 0, si = 0
      for (let r = 0; r < ny; r++) for (let c = 0; c < nx; c++) {
        const a = -2 * Math.PI * (kx * c / nx + ky * r / ny)
        sr += re[r * nx + c]! * Math.cos(a)
        si += re[r * nx + c]! * Math.sin(a)
      }
      expect(fr[ky * nx + kx]).toBeCloseTo(sr, 10)
      expect(fi[ky * nx + kx]).toBeCloseTo(si, 10)
    }
  })
})

describe('orientationFromFFT on synthetic lattice images', () => {
  it('Cu(111), 13° turn, 256² at 0.03 nm/px: rotation and nearest-neighbour spacing a/√2', () => {
    const img = latticeImage('Cu(111)', 13, 256, 256, 0.03, 0.03, 1)
    const o = orientationFromFFT(img, 256, 256, 0.03)
    expect(o.symmetry).toBe('hex')
    expect(Math.abs(o.rotation_deg - 13)).toBeLessThan(0.1)
    // A&S Table 4.3: a = 3.61 Å, nn = a/√2 = 0.2553 nm (derived).
    expect(o.spacing_nm / 0.2553 - 1).toBeLessThan(0.01)
    expect(o.spacing_nm / 0.2553 - 1).toBeGreaterThan(-0.01)
  })

  it('rotation is reported within (−30°, 30°] on (111): a 47° turn reads as −13°', () => {
    const img = latticeImage('Au(111)', 47, 200, 160, 0.035, 0.035, 2)
    const o = orientationFromFFT(img, 200, 160, 0.035)
    expect(Math.abs(o.rotation_deg - (-13))).toBeLessThan(0.3)
  })

  it('Ag(100), −20° turn, non-square pixels, non-power-of-two size', () => {
    const img = latticeImage('Ag(100)', -20, 300, 180, 0.03, 0.04, 3)
    const o = orientationFromFFT(img, 300, 180, [0.03, 0.04])
    expect(o.symmetry).toBe('square')
    expect(Math.abs(o.rotation_deg - (-20))).toBeLessThan(0.3)
    expect(Math.abs(o.spacing_nm / (0.409 / Math.SQRT2) - 1)).toBeLessThan(0.015)
  })

  it('Pt(110) with the face given: row direction and along-row spacing a/√2', () => {
    const img = latticeImage('Pt(110)', 35, 256, 256, 0.03, 0.03, 4)
    const o = orientationFromFFT(img, 256, 256, 0.03, { face: '110' })
    expect(Math.abs(o.rotation_deg - 35)).toBeLessThan(0.3)
    expect(Math.abs(o.spacing_nm / (0.392 / Math.SQRT2) - 1)).toBeLessThan(0.015)
  })

  it('recovers turns across the whole symmetry range of each face (compared modulo the symmetry angle)', () => {
    for (const id of ['Ni(111)', 'Pd(100)', 'Cu(110)']) {
      const s = getSurface(id)
      for (const th of [-29.5, -7, 0.4, 21, 44, 89]) {
        const o = orientationFromFFT(latticeImage(id, th, 256, 256, 0.03, 0.03, 5), 256, 256, 0.03, { face: s.face as '111' | '100' | '110' })
        const p = s.symmetry_deg
        const e = ((o.rotation_deg - th) % p + 1.5 * p) % p - p / 2
        expect(Math.abs(e)).toBeLessThan(0.1)
        expect(o.rotation_deg).toBeGreaterThan(-p / 2)
        expect(o.rotation_deg).toBeLessThanOrEqual(p / 2)
        expect(Math.abs(o.spacing_nm / s.nn_nm - 1)).toBeLessThan(0.005)
      }
    }
  })

  it('rejects bad images naming the field', () => {
    expectInputError(() => orientationFromFFT(new Float32Array(100), 20, 20, 0.03), 'heights')
    const nan = new Float32Array(400)
    nan[5] = Number.NaN
    expectInputError(() => orientationFromFFT(nan, 20, 20, 0.03), 'heights[5]')
    expectInputError(() => orientationFromFFT(new Float32Array(400), 20, 20, 0), 'pixel_nm')
    expectInputError(() => orientationFromFFT(new Float32Array(400), 20, 20, 0.03), 'heights')
    expectInputError(() => orientationFromFFT(new Float32Array(64), 8, 8, 0.03), 'width')
  })
})
