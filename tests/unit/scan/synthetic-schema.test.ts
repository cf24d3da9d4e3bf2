// Synthetic topographs (closed-form Gaussian: value h/2 at r = FWHM/2) and the seeded generators;
// the zod schema of POST /api/compute/detect (API contract in the README) with field-naming messages.
import { describe, expect, it } from 'vitest'
import { DetectInput, parseDetectInput } from '../../../shared/scan/schema'
import { mulberry32, normalGenerator, syntheticScan } from '../../../shared/scan/synthetic'

describe('seeded generators', () => {
  it('mulberry32 repeats for a seed, differs across seeds, and is uniform on [0, 1)', () => {
    const a = mulberry32(7), b = mulberry32(7), c = mulberry32(8)
    const xs = Array.from({ length: 100000 }, () => a())
    expect(Array.from({ length: 5 }, () => b())).toEqual(xs.slice(0, 5))
    expect(c()).not.toBe(xs[0])
    expect(Math.min(...xs)).toBeGreaterThanOrEqual(0)
    expect(Math.max(...xs)).toBeLessThan(1)
    // Mean 1/2 and variance 1/12 of U(0, 1), within a few standard errors for n = 1e5.
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length
    const variance = xs.reduce((s, x) => s + (x - mean) ** 2, 0) / xs.length
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.004)
    expect(Math.abs(variance - 1 / 12)).toBeLessThan(0.002)
  })

  it('Box–Muller normals have mean 0, variance 1 and 95.45 % within ±2σ', () => {
    const n = normalGenerator(mulberry32(3))
    const xs = Array.from({ length: 100000 }, n)
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length
    const variance = xs.reduce((s, x) => s + (x - mean) ** 2, 0) / xs.length
    expect(Math.abs(mean)).toBeLessThan(0.015)
    expect(Math.abs(variance - 1)).toBeLessThan(0.02)
    // P(|Z| < 2) = erf(√2) = 0.9545 (standard normal table).
    expect(Math.abs(xs.filter(x => Math.abs(x) < 2).length / xs.length - 0.9545)).toBeLessThan(0.004)
  })
})

describe('syntheticScan', () => {
  it('draws Gaussian adatoms: height at the centre, half height at FWHM/2', () => {
    // Adatom centred on pixel (10, 10): centre (10.5·0.1, 10.5·0.1) nm.
    const s = syntheticScan({ width: 21, height: 21, pixel_nm: 0.1, fwhm_nm: 0.8, atoms: [{ x_nm: 1.05, y_nm: 1.05, height_nm: 0.2 }] })
    expect(s.data[10 * 21 + 10]).toBeCloseTo(0.2, 7)
    expect(s.data[10 * 21 + 14]).toBeCloseTo(0.1, 7)
    expect(s.data[6 * 21 + 10]).toBeCloseTo(0.1, 7)
  })

  it('adds the tilt plane at pixel centres and one offset per line', () => {
    const s = syntheticScan({ width: 8, height: 5, pixel_nm: [0.2, 0.5], tilt: { dz_dx: 0.1, dz_dy: -0.3 }, line_offset_nm: 1, seed: 4 })
    for (let r = 0; r < 5; r++) {
      const offset = s.data[r * 8]! - (0.1 * 0.5 * 0.2 - 0.3 * (r + 0.5) * 0.5)
      for (let c = 0; c < 8; c++) expect(s.data[r * 8 + c]).toBeCloseTo(0.1 * (c + 0.5) * 0.2 - 0.3 * (r + 0.5) * 0.5 + offset, 5)
    }
  })

  it('places random adatoms at the density asked, never closer than the minimum separation', () => {
    const s = syntheticScan({ width: 500, height: 500, pixel_nm: 0.1, density_per_nm2: 0.25, min_separation_nm: 1.2, seed: 5 })
    expect(s.atoms.length).toBe(Math.round(0.25 * 50 * 50))
    let closest = Number.POSITIVE_INFINITY
    for (let i = 0; i < s.atoms.length; i++) {
      for (let j = i + 1; j < s.atoms.length; j++) {
        closest = Math.min(closest, Math.hypot(s.atoms[i]!.x_nm - s.atoms[j]!.x_nm, s.atoms[i]!.y_nm - s.atoms[j]!.y_nm))
      }
    }
    expect(closest).toBeGreaterThanOrEqual(1.2)
  })
})

describe('DetectInput schema', () => {
  const ok = { width: 3, height: 2, data: [0, 0.1, 0.2, 0.3, 0.4, 0.5], pixel_nm: [0.05, 0.1] }
  const firstIssue = (body: unknown) => {
    const r = DetectInput.safeParse(body)
    if (r.success) return null
    return { path: r.error.issues[0]!.path, message: r.error.issues[0]!.message }
  }

  it('accepts the documented shape, with optional fields', () => {
    expect(DetectInput.safeParse(ok).success).toBe(true)
    expect(DetectInput.safeParse({ ...ok, pixel_nm: 0.1, fwhm_nm: 0.8, min_height_nm: 0.03 }).success).toBe(true)
    expect(parseDetectInput(ok).pixel_nm).toEqual([0.05, 0.1])
  })

  it('names the field of each problem', () => {
    expect(firstIssue({ ...ok, width: 9000 })).toEqual({ path: ['width'], message: 'width must be at most 8192' })
    expect(firstIssue({ ...ok, height: 0 })?.path).toEqual(['height'])
    expect(firstIssue({ ...ok, data: [1, 2] })).toEqual({ path: ['data'], message: 'data holds 2 values but width × height = 6' })
    expect(firstIssue({ ...ok, data: [0, 0, 0, 0, Number.NaN, 0] })).toEqual({ path: ['data', 4], message: 'data[4] (row 1, column 1) must be a finite number of nm' })
    expect(firstIssue({ ...ok, data: [0, 0, '1', 0, 0, 0] })?.path).toEqual(['data', 2])
    expect(firstIssue({ ...ok, pixel_nm: [0.1, -1] })?.message).toMatch(/pixel_nm/)
    expect(firstIssue({ ...ok, pixel_nm: 'x' })?.path).toEqual(['pixel_nm'])
    expect(firstIssue({ ...ok, fwhm_nm: Number.POSITIVE_INFINITY })).toEqual({ path: ['fwhm_nm'], message: 'fwhm_nm must be a finite number (nm)' })
    expect(firstIssue({ ...ok, min_height_nm: -0.1 })?.message).toBe('min_height_nm must be ≥ 0')
  })

  it('parseDetectInput throws an InputError naming the field', () => {
    expect(() => parseDetectInput({ ...ok, data: [0, 0, 0, 0, 0, Number.NaN] })).toThrow(expect.objectContaining({ name: 'InputError', field: 'data[5]' }))
    expect(() => parseDetectInput({ ...ok, pixel_nm: [1, 0] })).toThrow(expect.objectContaining({ field: 'pixel_nm[1]', message: 'pixel_nm[1] must be greater than 0 nm' }))
    expect(() => parseDetectInput(null)).toThrow(expect.objectContaining({ field: 'body', message: 'the body must be an object with width, height, data and pixel_nm' }))
  })
})
