// Lattice and blueprint benchmarks: nearest-site lookup (grid index vs analytic), lattice fit,
// spacing rules, FFT orientation. Prints medians; nothing is asserted.
import { fft as mathFft } from 'mathjs'
import { checkRules, expandShape } from '../../shared/blueprint'
import { GridIndex, fft2, fitLattice, getSurface, idealLattice, nearestSite, nearestSites, orientationFromFFT, sitesInRect } from '../../shared/lattice'
import { rng, syntheticMarks } from '../unit/lattice/synthetic'
import { bench, section } from './harness'

export async function run(): Promise<void> {
  section('lattice: nearest site, 1e5 queries over 1e5 sites (Cu(111) fcc)')
  const lat = idealLattice('Cu(111)', 'fcc')
  const side = Math.sqrt(1e5 * getSurface('Cu(111)').cellArea_nm2)
  const sites = sitesInRect(lat, { x0: 0, y0: 0, x1: side, y1: side })
  const xy = new Float64Array(sites.length * 2)
  sites.forEach((s, k) => {
    xy[2 * k] = s.x
    xy[2 * k + 1] = s.y
  })
  const rand = rng(1)
  const q = new Float64Array(2e5)
  for (let k = 0; k < 2e5; k++) q[k] = rand() * side
  let index = new GridIndex(xy)
  await bench(`grid index build (${sites.length} sites)`, () => {
    index = new GridIndex(xy)
  })
  await bench('grid index nearest ×1e5', () => {
    let acc = 0
    for (let k = 0; k < 1e5; k++) acc += index.nearest(q[2 * k]!, q[2 * k + 1]!)
    return acc
  })
  await bench('analytic nearestSites (batch) ×1e5', () => nearestSites(lat, q))
  await bench('analytic nearestSite (per call) ×1e5', () => {
    let acc = 0
    for (let k = 0; k < 1e5; k++) acc += nearestSite(lat, [q[2 * k]!, q[2 * k + 1]!]).i
    return acc
  })
  await bench('grid index withinRadius(0.6 nm) ×1e5', () => {
    const buf: number[] = []
    let acc = 0
    for (let k = 0; k < 1e5; k++) {
      buf.length = 0
      acc += index.withinRadius(q[2 * k]!, q[2 * k + 1]!, 0.6, buf).length
    }
    return acc
  })

  section('lattice fit (Cu(111) fcc, 12° turn, 2 % anisotropic scale + 1° shear, σ = 0.01 nm, 2 % outliers)')
  const s = getSurface('Cu(111)')
  const th = 12 * Math.PI / 180
  const M: [[number, number], [number, number]] = [[1.02 * Math.cos(th), Math.cos(th) * 0.01745 - Math.sin(th)], [1.02 * Math.sin(th), Math.sin(th) * 0.01745 + Math.cos(th)]]
  for (const [count, half] of [[200, 40], [2000, 120]] as const) {
    const syn = syntheticMarks({ seed: 7, count, half, a1: s.a1, a2: s.a2, basis: [[0, 0]], M, t: [3, -2], sigma_nm: 0.01, nOut: Math.round(count * 0.02) })
    let last = fitLattice({ surface: 'Cu(111)', marks: syn.marks })
    await bench(`fitLattice ${count} marks (affine)`, () => {
      last = fitLattice({ surface: 'Cu(111)', marks: syn.marks })
    }, { note: () => `${last.inliers} inliers, rms ${last.residual_nm.toFixed(4)} nm` })
    await bench(`fitLattice ${count} marks (rigid)`, () => fitLattice({ surface: 'Cu(111)', marks: syn.marks, affine: false }))
  }

  section('blueprint')
  const patch = expandShape({ type: 'patch', kind: 'triangular', spacing: 2, region: [[0, 0], [52, 0], [52, 50], [0, 50]] }, 'Cu(111)', 'fcc')
  const jitter = patch.map((p, k) => ({ x_nm: p.x_nm + (k % 13 === 0 ? 0.3 : 0), y_nm: p.y_nm }))
  await bench(`expand patch (${patch.length} sites)`, () => expandShape({ type: 'patch', kind: 'triangular', spacing: 2, region: [[0, 0], [52, 0], [52, 50], [0, 50]] }, 'Cu(111)', 'fcc'))
  let issues = 0
  await bench(`checkRules ${jitter.length} sites`, () => {
    issues = checkRules(jitter, { surface: 'Cu(111)', bounds: { x0: 1, y0: 1, x1: 51, y1: 49 } }).length
  }, { note: () => `${issues} issues` })
  await bench('expand ring n = 48, R = 7.13 nm', () => expandShape({ type: 'ring', center: [0, 0], radius_nm: 7.13, n: 48 }, 'Cu(111)', 'fcc'))

  section('FFT orientation')
  for (const n of [256, 512]) {
    const re = new Float64Array(n * n), im = new Float64Array(n * n)
    for (let k = 0; k < n * n; k++) re[k] = Math.sin(k * 0.37)
    await bench(`own radix-2 fft2 ${n}²`, () => {
      const r = re.slice(), i = im.slice()
      fft2(r, i, n, n)
    })
    const img = new Float32Array(n * n)
    const b = 2 / (Math.sqrt(3) * s.nn_nm)
    for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) {
      const x = c * 0.03, y = r * 0.03
      img[r * n + c] = Math.cos(2 * Math.PI * b * y) + Math.cos(2 * Math.PI * b * (x * Math.sqrt(3) / 2 + y / 2)) + Math.cos(2 * Math.PI * b * (x * Math.sqrt(3) / 2 - y / 2))
    }
    await bench(`orientationFromFFT ${n}²`, () => orientationFromFFT(img, n, n, 0.03))
  }
  const grid = Array.from({ length: 256 }, (_, r) => Array.from({ length: 256 }, (_, c) => Math.sin(r * 0.1 + c * 0.3)))
  await bench('mathjs fft 256² (nested arrays, for comparison)', () => mathFft(grid), { runs: 3, warmup: 0 })
}
