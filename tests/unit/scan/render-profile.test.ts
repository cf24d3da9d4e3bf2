// Rendering (linear map of [lo, hi] onto 256 equal bins) against a per-pixel brute-force lookup;
// line profiles: bilinear interpolation reproduces any plane z = a + b·x + c·y exactly (closed form).
import { describe, expect, it } from 'vitest'
import { colormapLut } from '../../../shared/scan/colormap'
import { lineProfile } from '../../../shared/scan/profile'
import { renderRGBA } from '../../../shared/scan/render'
import { mulberry32 } from '../../../shared/scan/synthetic'

describe('renderRGBA', () => {
  it('looks every pixel up in the colour map like a brute-force mapping', () => {
    const rnd = mulberry32(2)
    const data = Float32Array.from({ length: 300 }, () => rnd() * 3 - 1)
    data[0] = Number.NaN
    data[1] = Number.POSITIVE_INFINITY
    for (const [colormap, invert] of [['grey', false], ['kiln', false], ['fjord', true]] as const) {
      const out = renderRGBA({ width: 20, height: 15, data }, { lo: -0.5, hi: 1.5, colormap, invert })
      const lut = colormapLut(colormap)
      for (let i = 0; i < data.length; i++) {
        const v = data[i]!
        if (!Number.isFinite(v)) {
          expect(Array.from(out.subarray(4 * i, 4 * i + 4))).toEqual([0, 0, 0, 0])
          continue
        }
        let k = Math.min(255, Math.max(0, Math.floor(((v + 0.5) / 2) * 256)))
        if (invert) k = 255 - k
        expect(Array.from(out.subarray(4 * i, 4 * i + 4))).toEqual([lut[3 * k]!, lut[3 * k + 1]!, lut[3 * k + 2]!, 255])
      }
    }
  })

  it('maps lo to the first entry, hi to the last and rejects hi ≤ lo', () => {
    const out = renderRGBA({ width: 3, height: 1, data: [0, 0.5, 1] }, { lo: 0, hi: 1 })
    expect(Array.from(out)).toEqual([0, 0, 0, 255, 128, 128, 128, 255, 255, 255, 255, 255])
    expect(() => renderRGBA({ width: 1, height: 1, data: [0] }, { lo: 1, hi: 1 })).toThrow(/hi must be greater than lo/)
    expect(() => renderRGBA({ width: 1, height: 1, data: [0] }, { lo: 0, hi: 1, colormap: 'rainbow' as never })).toThrow(/unknown colour map "rainbow"/)
  })
})

describe('lineProfile', () => {
  const w = 40, h = 30
  const px = 0.05, py = 0.08
  const plane = (x: number, y: number) => 0.3 + 0.7 * x - 1.1 * y
  // Pixel (c, r) has its centre at ((c + 0.5)·px, (r + 0.5)·py).
  const data = Float64Array.from({ length: w * h }, (_, i) => plane(((i % w) + 0.5) * px, (Math.floor(i / w) + 0.5) * py))

  it('reproduces a plane between pixel centres, with anisotropic pixels', () => {
    const p0: [number, number] = [0.2, 0.3], p1: [number, number] = [1.7, 2.0]
    const prof = lineProfile({ width: w, height: h, data }, [px, py], p0, p1, { samples: 31 })
    const L = Math.hypot(1.5, 1.7)
    expect(prof.distance_nm.at(-1)).toBeCloseTo(L, 12)
    prof.height_nm.forEach((z, i) => {
      const t = i / 30
      expect(z).toBeCloseTo(plane(p0[0] + t * 1.5, p0[1] + t * 1.7), 10)
      expect(prof.distance_nm[i]).toBeCloseTo(t * L, 12)
    })
  })

  it('samples one point per pixel step by default and names a point outside the frame', () => {
    const prof = lineProfile({ width: w, height: h, data }, [px, py], [0.5 * px, 0.5 * py], [10.5 * px, 0.5 * py])
    expect(prof.height_nm).toHaveLength(11)
    expect(() => lineProfile({ width: w, height: h, data }, [px, py], [0, 0], [5, 0])).toThrow(/p1 = \[5, 0\] nm lies outside the scan frame/)
  })
})
