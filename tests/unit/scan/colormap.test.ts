// Colour maps. The OKLab check uses a second, independent route written here: sRGB → XYZ with the
// IEC 61966-2-1 matrix, then XYZ → OKLab with the M1/M2 matrices as published by B. Ottosson
// ("A perceptual color space for image processing", 2020). That route is first held against the
// XYZ → OKLab test pairs printed in the same post (3 decimals; digits from memory).
import { describe, expect, it } from 'vitest'
import { COLORMAP_NAMES, COLORMAP_RAMPS, colormapLut } from '../../../shared/scan/colormap'
import { oklabToLinearSrgb, srgbToOklab } from '../../../shared/scan/oklab'
import { mulberry32 } from '../../../shared/scan/synthetic'

const decode = (v: number) => (v <= 0.04045 ? v / 12.92 : ((v + 0.055) / 1.055) ** 2.4)

function xyzToOklab([X, Y, Z]: number[]): [number, number, number] {
  const l = Math.cbrt(0.8189330101 * X! + 0.3618667424 * Y! - 0.1288597137 * Z!)
  const m = Math.cbrt(0.0329845436 * X! + 0.9293118715 * Y! + 0.0361456387 * Z!)
  const s = Math.cbrt(0.0482003018 * X! + 0.2643662691 * Y! + 0.6338517070 * Z!)
  return [
    0.2104542553 * l + 0.7936177850 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.4285922050 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.8086757660 * s,
  ]
}

function srgbToOklabViaXyz(r: number, g: number, b: number) {
  const [R, G, B] = [decode(r), decode(g), decode(b)]
  return xyzToOklab([0.4124 * R + 0.3576 * G + 0.1805 * B, 0.2126 * R + 0.7152 * G + 0.0722 * B, 0.0193 * R + 0.1192 * G + 0.9505 * B])
}

describe('OKLab', () => {
  it('the XYZ route reproduces Ottosson\'s published test pairs', () => {
    const pairs: [number[], number[]][] = [
      [[0.950, 1.000, 1.089], [1.000, 0.000, 0.000]],
      [[1.000, 0.000, 0.000], [0.450, 1.236, -0.019]],
      [[0.000, 1.000, 0.000], [0.922, -0.671, 0.263]],
      [[0.000, 0.000, 1.000], [0.153, -1.415, -0.449]],
    ]
    for (const [xyz, lab] of pairs) xyzToOklab(xyz).forEach((v, k) => expect(Math.abs(v - lab[k]!)).toBeLessThan(1e-3))
  })

  it('our sRGB → OKLab agrees with the XYZ route and inverts', () => {
    const rnd = mulberry32(8)
    for (let i = 0; i < 500; i++) {
      const c: [number, number, number] = [rnd(), rnd(), rnd()]
      const ours = srgbToOklab(c)
      // The two routes differ only by the 4-digit rounding of the IEC matrix.
      srgbToOklabViaXyz(...c).forEach((v, k) => expect(Math.abs(v - ours[k]!)).toBeLessThan(5e-4))
      const back = oklabToLinearSrgb(ours)
      // The published inverse matrices carry 10 digits: the round trip holds to about 1e-7.
      back.forEach((v, k) => expect(v).toBeCloseTo(decode(c[k]!), 6))
    }
  })
})

describe('colour maps', () => {
  it('grey is the identity ramp', () => {
    const lut = colormapLut('grey')
    for (let i = 0; i < 256; i++) expect(Array.from(lut.subarray(3 * i, 3 * i + 3))).toEqual([i, i, i])
  })

  for (const name of ['kiln', 'fjord'] as const) {
    it(`${name}: lightness rises strictly and linearly, hue turns one way`, () => {
      const lut = colormapLut(name)
      expect(lut).toHaveLength(768)
      const ramp = COLORMAP_RAMPS[name]
      const lab = Array.from({ length: 256 }, (_, i) => srgbToOklabViaXyz(lut[3 * i]! / 255, lut[3 * i + 1]! / 255, lut[3 * i + 2]! / 255))
      for (let i = 1; i < 256; i++) expect(lab[i]![0]).toBeGreaterThan(lab[i - 1]![0])
      // Linear in L up to 8-bit rounding of the entries.
      lab.forEach(([L], i) => expect(Math.abs(L - (ramp.L0 + ((ramp.L1 - ramp.L0) * i) / 255))).toBeLessThan(0.005))
      // Hue, unwrapped, every 16 entries (8-bit rounding jitters single entries by a few degrees
      // where chroma is low): always moving in the design direction, spanning the design turn.
      const hue = lab.map(([, a, b]) => (Math.atan2(b, a) * 180) / Math.PI)
      const turn = [hue[0]!]
      for (let i = 1; i < 256; i++) {
        let d = hue[i]! - hue[i - 1]!
        d -= 360 * Math.round(d / 360)
        turn.push(turn[i - 1]! + d)
      }
      const dir = Math.sign(ramp.h1_deg - ramp.h0_deg)
      for (let i = 16; i < 256; i += 16) expect(dir * (turn[i]! - turn[i - 16]!)).toBeGreaterThan(0)
      expect(Math.abs(turn[255]! - turn[0]! - (ramp.h1_deg - ramp.h0_deg))).toBeLessThan(10)
    })
  }

  it('offers grey first and only its own names', () => {
    expect(COLORMAP_NAMES).toEqual(['grey', 'kiln', 'fjord'])
  })
})
