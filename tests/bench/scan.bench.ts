// Scan core figures: adatom detection on synthetic topographs at ~1 adatom per 4 nm² (0.8 nm FWHM,
// 0.1 nm high, 4 pm noise, tilt and line offsets), decoding, leveling, rendering, and the cost of
// validating a 2048² body with zod's array schema versus the plain loop used by DetectInput.
import { PNG } from 'pngjs'
import { z } from 'zod'
import { decodeScan } from '../../shared/scan/decode'
import { detectAdatoms } from '../../shared/scan/detect'
import { percentileRange } from '../../shared/scan/contrast'
import { levelLinesMedianDiff, levelLinesPolynomial, subtractPlane } from '../../shared/scan/level'
import { renderRGBA } from '../../shared/scan/render'
import { DetectInput } from '../../shared/scan/schema'
import { syntheticScan } from '../../shared/scan/synthetic'
import { writeTiff } from '../unit/scan/tiff-writer'
import { bench, section } from './harness'

function scan(side: number, pixel_nm: number) {
  return syntheticScan({
    width: side, height: side, pixel_nm, fwhm_nm: 0.8, height_nm: 0.1, noise_nm: 0.004,
    tilt: { dz_dx: 0.05, dz_dy: -0.03 }, line_offset_nm: 0.05, density_per_nm2: 0.25, min_separation_nm: 1.2, seed: 1,
  })
}

export async function run(): Promise<void> {
  section('scan: adatom detection (1 adatom / 4 nm², FWHM 0.8 nm)')
  for (const [side, px] of [[1024, 0.1], [2048, 0.1], [2048, 0.05], [2048, 0.2]] as const) {
    const s = scan(side, px)
    let marks = 0
    let binning = ''
    await bench(`detect ${side}² at ${px} nm/px (${s.atoms.length} adatoms)`, () => {
      const r = detectAdatoms({ width: s.width, height: s.height, data: s.data, pixel_nm: px })
      marks = r.marks.length
      binning = r.binning.join('×')
    }, { runs: 5, target_ms: side === 2048 ? 500 : undefined, note: () => `${marks} marks, blocks ${binning}` })
  }
  const s2 = scan(2048, 0.1)
  const json = Array.from(s2.data)
  await bench('detect 2048² at 0.1 nm/px from number[] (a JSON body)', () => detectAdatoms({ width: 2048, height: 2048, data: json, pixel_nm: 0.1 }), { runs: 5, target_ms: 500 })

  section('scan: validating a 2048² detect body')
  const body = { width: 2048, height: 2048, data: json, pixel_nm: 0.1 }
  const zodArray = z.object({ width: z.number(), height: z.number(), data: z.array(z.number()), pixel_nm: z.number() })
  await bench('DetectInput (zod scalars + plain loop over data)', () => DetectInput.parse(body), { runs: 5 })
  await bench('zod z.array(z.number()) over data, for comparison', () => zodArray.parse(body), { runs: 5 })

  section('scan: decoding 2048² uploads')
  const levels = new Uint16Array(2048 * 2048)
  for (let i = 0; i < levels.length; i++) levels[i] = Math.max(0, Math.min(65535, Math.round(30000 + 100000 * s2.data[i]!)))
  const png = new PNG({ width: 2048, height: 2048, bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false })
  png.data = Buffer.from(levels.buffer)
  const pngBytes = new Uint8Array(PNG.sync.write(png, { bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false }))
  await bench(`decodeScan 16-bit grey PNG (${(pngBytes.length / 1e6).toFixed(1)} MB)`, () => decodeScan(pngBytes, { filename: 'scan.png' }), { runs: 5 })
  await bench('pngjs PNG.sync.read of the same file, for comparison', () => PNG.sync.read(Buffer.from(pngBytes), { skipRescale: true }), { runs: 5 })
  const tiffBytes = writeTiff({ width: 2048, height: 2048, samples: s2.data, bits: 32, sampleFormat: 3, rowsPerStrip: 64 })
  await bench('decodeScan 32-bit float TIFF (16.8 MB, uncompressed)', () => decodeScan(tiffBytes, { filename: 'scan.tif' }), { runs: 5 })
  const lzwBytes = writeTiff({ width: 2048, height: 2048, samples: levels, bits: 16, compression: 5, predictor: 2, rowsPerStrip: 64 })
  await bench(`decodeScan 16-bit TIFF, LZW + predictor (${(lzwBytes.length / 1e6).toFixed(1)} MB)`, () => decodeScan(lzwBytes, { filename: 'scan.tif' }), { runs: 5 })

  const csv = Array.from({ length: 2048 }, (_, r) => Array.from(s2.data.subarray(r * 2048, (r + 1) * 2048), v => v.toFixed(5)).join(',')).join('\n')
  const csvBytes = new TextEncoder().encode(`# heights in nm\n${csv}\n`)
  await bench(`decodeScan CSV text grid (${(csvBytes.length / 1e6).toFixed(1)} MB)`, () => decodeScan(csvBytes, { filename: 'scan.csv' }), { runs: 3 })

  section('scan: leveling, contrast and rendering 2048²')
  const grid = { width: 2048, height: 2048, data: s2.data }
  await bench('subtractPlane', () => subtractPlane(grid), { runs: 7 })
  await bench('levelLinesMedianDiff', () => levelLinesMedianDiff(grid), { runs: 7 })
  await bench('subtractPlane + levelLinesMedianDiff', () => levelLinesMedianDiff(subtractPlane(grid).grid), { runs: 7 })
  await bench('levelLinesPolynomial order 3', () => levelLinesPolynomial(grid, 3), { runs: 7 })
  await bench('percentileRange 0.5 / 99.5 % (exact)', () => percentileRange(grid.data), { runs: 7 })
  await bench('renderRGBA kiln', () => renderRGBA(grid, { lo: -0.3, hi: 0.3, colormap: 'kiln' }), { runs: 7 })
}
