// Level → height scaling (closed-form linear maps) and the TSG1 storage layout, whose bytes are
// checked against a layout written here with DataView (IEEE 754 binary32, little-endian).
import { describe, expect, it } from 'vitest'
import { InputError } from '../../../shared/errors'
import { decodeFloat32Grid, encodeFloat32Grid } from '../../../shared/scan/gridfile'
import { toHeights } from '../../../shared/scan/heights'
import type { RawScan } from '../../../shared/scan/types'

const levels = (data: number[], bitDepth: number, extra: Partial<RawScan> = {}): RawScan => ({
  width: data.length, height: 1, data: Float32Array.from(data), format: 'png', bitDepth, sampleType: 'uint',
  valueUnit: 'level', reduction: 'none', levelRange: [0, 2 ** bitDepth - 1], ...extra,
})

describe('toHeights', () => {
  it('maps levels by nm_per_level and the full 16-bit range onto z_range_nm', () => {
    expect(Array.from(toHeights(levels([0, 1, 1000], 16), { nm_per_level: 0.001 }).data)).toEqual([0, 0.001, 1].map(Math.fround))
    const z = toHeights(levels([0, 32767.5, 65535], 16), { z_range_nm: 2 }).data
    expect(z[0]).toBe(0)
    expect(z[2]).toBe(2)
    expect(z[1]).toBeCloseTo(1, 6)
    // Signed levels: [−32768, 32767] → [0, z_range].
    const s = toHeights(levels([-32768, 32767], 16, { sampleType: 'int', levelRange: [-32768, 32767] }), { z_range_nm: 5 }).data
    expect(Array.from(s)).toEqual([0, 5])
  })

  it('multiplies nm data by an optional factor and refuses level scales for them', () => {
    const nm: RawScan = { ...levels([1.5, -2], 32), format: 'text', sampleType: 'float', valueUnit: 'nm' }
    expect(Array.from(toHeights(nm).data)).toEqual([1.5, -2])
    expect(Array.from(toHeights(nm, { factor: 1e9 * 1e-9 * 10 }).data)).toEqual([15, -20])
    expect(() => toHeights(nm, { nm_per_level: 1 })).toThrow(/already holds heights in nm/)
  })

  it('names the missing or bad scale', () => {
    expect(() => toHeights(levels([1], 8))).toThrow(InputError)
    expect(() => toHeights(levels([1], 8))).toThrow(/holds grey levels, not heights: give nm_per_level or z_range_nm/)
    try {
      toHeights(levels([1], 8), { z_range_nm: -1 })
    }
    catch (e) {
      expect((e as InputError).field).toBe('z_range_nm')
    }
    expect(() => toHeights(levels([1], 8), { nm_per_level: Number.NaN })).toThrow(/nm_per_level must be a finite number greater than 0/)
  })
})

describe('TSG1 grid storage', () => {
  const grid = { width: 3, height: 2, data: Float32Array.of(0.1, -2.5, 3e-7, Number.MAX_VALUE > 0 ? 1e30 : 0, -0, 42) }

  it('writes the documented byte layout', () => {
    const bytes = encodeFloat32Grid(grid)
    const ref = new DataView(new ArrayBuffer(12 + 24))
    'TSG1'.split('').forEach((ch, i) => ref.setUint8(i, ch.charCodeAt(0)))
    ref.setUint32(4, 3, true)
    ref.setUint32(8, 2, true)
    grid.data.forEach((v, i) => ref.setFloat32(12 + 4 * i, v, true))
    expect(Array.from(bytes)).toEqual(Array.from(new Uint8Array(ref.buffer)))
  })

  it('reads back bit-exactly, also from an unaligned view', () => {
    const bytes = encodeFloat32Grid(grid)
    const shifted = new Uint8Array(bytes.length + 1)
    shifted.set(bytes, 1)
    const back = decodeFloat32Grid(shifted.subarray(1))
    expect([back.width, back.height]).toEqual([3, 2])
    expect(Array.from(new Uint32Array(back.data.buffer))).toEqual(Array.from(new Uint32Array(grid.data.buffer)))
  })

  it('rejects a wrong magic, size or length', () => {
    const bytes = encodeFloat32Grid(grid)
    expect(() => decodeFloat32Grid(bytes.subarray(0, 20))).toThrow(/needs 36/)
    const bad = bytes.slice()
    bad[3] = 0x32
    expect(() => decodeFloat32Grid(bad)).toThrow(/missing TSG1 header/)
    const huge = bytes.slice()
    new DataView(huge.buffer).setUint32(4, 100000, true)
    expect(() => decodeFloat32Grid(huge)).toThrow(/invalid size 100000 × 2/)
  })
})
