// Adatom detection on fixed-seed synthetic topographs with known adatom positions (synthetic.ts):
// Gaussian adatoms of 0.8 nm FWHM and 0.1 nm height, white noise σ = 4 pm (peak/noise 25),
// tilt 0.05 and −0.03 nm/nm, random line offsets σ = 50 pm. Targets from the issue: recall and
// precision ≥ 99 %, mean position error < 0.1 pixel.
import { describe, expect, it } from 'vitest'
import { InputError } from '../../../shared/errors'
import { detectAdatoms, type Mark } from '../../../shared/scan/detect'
import { GaussFitter } from '../../../shared/scan/fit'
import { refine1D } from '../../../shared/scan/peaks'
import { syntheticScan, type SyntheticAtom, type SyntheticOptions } from '../../../shared/scan/synthetic'

const RAW_SCAN: Omit<SyntheticOptions, 'width' | 'height' | 'pixel_nm'> = {
  fwhm_nm: 0.8, height_nm: 0.1, noise_nm: 0.004, tilt: { dz_dx: 0.05, dz_dy: -0.03 }, line_offset_nm: 0.05,
  density_per_nm2: 0.1, min_separation_nm: 1.6,
}

interface Score { recall: number, precision: number, errX_px: number, errY_px: number, err_px: number, heightRatio: number, n: number }

// One-to-one matching, nearest first, within 0.3 nm (under a fifth of the 1.6 nm spacing).
// Recall counts adatoms at least one FWHM inside the frame; precision counts every mark.
function score(atoms: SyntheticAtom[], marks: Mark[], px: number, py: number, W_nm: number, H_nm: number): Score {
  const pairs: [number, number, number][] = []
  atoms.forEach((a, i) => marks.forEach((m, j) => {
    const d = Math.hypot(m.x_nm - a.x_nm, m.y_nm - a.y_nm)
    if (d < 0.3) pairs.push([d, i, j])
  }))
  pairs.sort((p, q) => p[0] - q[0])
  const atomUsed = new Set<number>(), markUsed = new Set<number>()
  let inside = 0, found = 0, ex = 0, ey = 0, e = 0, hr = 0
  const interior = (a: SyntheticAtom) => a.x_nm > 0.8 && a.x_nm < W_nm - 0.8 && a.y_nm > 0.8 && a.y_nm < H_nm - 0.8
  for (const [, i, j] of pairs) {
    if (atomUsed.has(i) || markUsed.has(j)) continue
    atomUsed.add(i)
    markUsed.add(j)
    const a = atoms[i]!, m = marks[j]!
    if (!interior(a)) continue
    found++
    const dx = (m.x_nm - a.x_nm) / px, dy = (m.y_nm - a.y_nm) / py
    ex += Math.abs(dx)
    ey += Math.abs(dy)
    e += Math.hypot(dx, dy)
    hr += m.height_nm / a.height_nm
  }
  for (const a of atoms) if (interior(a)) inside++
  return { recall: found / inside, precision: markUsed.size / marks.length, errX_px: ex / found, errY_px: ey / found, err_px: e / found, heightRatio: hr / found, n: inside }
}

describe('adatom detection', () => {
  for (const seed of [1, 2, 3]) {
    it(`finds adatoms in a raw (tilted, line-offset, noisy) scan, seed ${seed}`, () => {
      const s = syntheticScan({ ...RAW_SCAN, width: 512, height: 512, pixel_nm: 0.08, seed })
      const res = detectAdatoms({ width: s.width, height: s.height, data: s.data, pixel_nm: 0.08 })
      const sc = score(s.atoms, res.marks, 0.08, 0.08, 512 * 0.08, 512 * 0.08)
      expect(sc.n).toBeGreaterThan(120)
      expect(sc.recall).toBeGreaterThanOrEqual(0.99)
      expect(sc.precision).toBeGreaterThanOrEqual(0.99)
      expect(sc.err_px).toBeLessThan(0.1)
      // Apparent height from the fit: within 5 % on average.
      expect(Math.abs(sc.heightRatio - 1)).toBeLessThan(0.05)
      // The noise estimate recovers the σ put in.
      expect(res.noise_nm).toBeGreaterThan(0.0036)
      expect(res.noise_nm).toBeLessThan(0.0044)
    })
  }

  it('gives correct nm positions with anisotropic pixels', () => {
    const px = 0.05, py = 0.12
    const s = syntheticScan({ ...RAW_SCAN, width: 768, height: 320, pixel_nm: [px, py], seed: 4 })
    const res = detectAdatoms({ width: s.width, height: s.height, data: s.data, pixel_nm: [px, py] })
    const sc = score(s.atoms, res.marks, px, py, 768 * px, 320 * py)
    expect(sc.recall).toBeGreaterThanOrEqual(0.99)
    expect(sc.precision).toBeGreaterThanOrEqual(0.99)
    expect(sc.errX_px).toBeLessThan(0.1)
    expect(sc.errY_px).toBeLessThan(0.1)
    // Swapping the axes of the same scan must not work: positions are tied to [px, py].
    const wrong = detectAdatoms({ width: s.width, height: s.height, data: s.data, pixel_nm: [py, px] })
    expect(score(s.atoms, wrong.marks, px, py, 768 * px, 320 * py).recall).toBeLessThan(0.2)
  })

  it('reports nothing on pure noise with offsets and tilt, and respects min_height_nm', () => {
    const noise = syntheticScan({ width: 400, height: 400, pixel_nm: 0.1, noise_nm: 0.01, line_offset_nm: 0.05, tilt: { dz_dx: 0.02, dz_dy: 0.01 }, seed: 6 })
    expect(detectAdatoms({ ...noise, min_height_nm: 0 }).marks).toHaveLength(0)
    const low = syntheticScan({ ...RAW_SCAN, width: 256, height: 256, pixel_nm: 0.1, height_nm: 0.02, seed: 7 })
    expect(low.atoms.length).toBeGreaterThan(20)
    expect(detectAdatoms({ ...low }).marks).toHaveLength(0)
    const found = detectAdatoms({ ...low, min_height_nm: 0.01 }).marks
    const sc = score(low.atoms, found, 0.1, 0.1, 25.6, 25.6)
    expect(sc.recall).toBeGreaterThanOrEqual(0.99)
    expect(sc.precision).toBeGreaterThanOrEqual(0.99)
  })

  it('names bad input fields', () => {
    const base = { width: 2, height: 2, data: [0, 0, 0, 0], pixel_nm: 0.1 }
    const field = (fn: () => unknown) => {
      try {
        fn()
      }
      catch (e) {
        return e instanceof InputError ? e.field : 'not an InputError'
      }
      return 'no error'
    }
    expect(field(() => detectAdatoms({ ...base, data: [0, 0, Number.NaN, 0] }))).toBe('data[2]')
    expect(field(() => detectAdatoms({ ...base, data: [0, 0, 0] }))).toBe('data')
    expect(field(() => detectAdatoms({ ...base, pixel_nm: [0.1, -1] }))).toBe('pixel_nm[1]')
    expect(field(() => detectAdatoms({ ...base, fwhm_nm: 0 }))).toBe('fwhm_nm')
    expect(field(() => detectAdatoms({ ...base, min_height_nm: -1 }))).toBe('min_height_nm')
    expect(field(() => detectAdatoms({ ...base, width: 1.5 }))).toBe('width')
  })
})

describe('sub-pixel estimators', () => {
  it('the three-point log-parabola is exact for a sampled Gaussian (closed form)', () => {
    for (const [delta, s] of [[0.3, 1.2], [-0.45, 2], [0, 0.8]] as const) {
      const g = (x: number) => 2.5 * Math.exp(-((x - delta) ** 2) / (2 * s * s))
      const r = refine1D(g(-1), g(0), g(1))
      expect(r.delta).toBeCloseTo(delta, 12)
      expect(g(0) * r.gain).toBeCloseTo(2.5, 12)
    }
  })

  it('the Gaussian least-squares fit recovers centre, amplitude and background exactly', () => {
    const w = 15, h = 13, sx = 1.4, sy = 1.1
    const data = Float32Array.from({ length: w * h }, (_, i) => 0.3 + 0.8 * Math.exp(-(((i % w) - 7.27) ** 2) / (2 * sx * sx) - ((Math.floor(i / w) - 5.81) ** 2) / (2 * sy * sy)))
    const fit = new GaussFitter(data, w, h, sx, sy).fit(7, 6)!
    expect(fit.x0).toBeCloseTo(7.27, 5)
    expect(fit.y0).toBeCloseTo(5.81, 5)
    expect(fit.A).toBeCloseTo(0.8, 5)
    expect(fit.B).toBeCloseTo(0.3, 5)
  })
})
