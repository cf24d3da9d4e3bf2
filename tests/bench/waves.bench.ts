// Wave preview and as-built check benchmarks: `npx tsx tests/bench/index.ts waves`.
// Synthetic inputs from a fixed-seed generator; figures are printed, never asserted.
import * as math from 'mathjs'
import { bench, section } from './harness'
import { corralLevels, corralMap, corralModes, lorentzian } from '../../shared/waves/corral'
import { computeCorral } from '../../shared/waves/compute-corral'
import { BLACK_DOT, ScatteringAtEnergy, scatteringMap, scatteringSpectrum, waveNumber } from '../../shared/waves/scattering'
import { luFactor, luSolve } from '../../shared/waves/complex-lu'
import { hankel1Zero } from '../../shared/waves/bessel'
import { hankel1ZeroComplex } from '../../shared/waves/hankel-complex'
import { checkAsBuilt } from '../../shared/compare/check'
import { fitCircle } from '../../shared/waves/geometry'
import { findSpectrumPeaks } from '../../shared/waves/peaks'
import { parseSpectrumCsv } from '../../shared/waves/spectrum-csv'

function rng(seed: number) {
  let s = seed
  return () => (s = (s * 16807) % 2147483647) / 2147483647
}

/** n scatterers in a square of side `side` nm, at least 0.5 nm apart. */
function scatterers(n: number, side: number): Float64Array {
  const r = rng(42)
  const pts: [number, number][] = []
  while (pts.length < n) {
    const p: [number, number] = [r() * side, r() * side]
    if (pts.every(q => Math.hypot(q[0] - p[0], q[1] - p[1]) > 0.5)) pts.push(p)
  }
  return Float64Array.from(pts.flat())
}

export async function run(): Promise<void> {
  const cu = { E0_eV: -0.44, m_eff: 0.38 }

  section('wave preview: hard-wall corral (R = 7.13 nm, Cu(111))')
  const modes = corralModes(corralLevels({ radius_nm: 7.13, ...cu, maxE_eV: 0 + 1 }), 7.13)
  await bench(`corralMap 256² (${modes.length} levels summed)`, () => corralMap(modes, 7.13, 0, 0.01, 256, 7.13), { runs: 9, target_ms: 50 })
  await bench('computeCorral: levels + 301-pt spectrum + 256² map', () => computeCorral({ shape: 'circle', radius_nm: 7.13, ...cu, broadening_eV: 0.01, bias_V: 0, map_px: 256 }), { runs: 9, target_ms: 50 })

  section('wave preview: s-wave multiple scattering, 100 scatterers in 20 × 20 nm')
  const xy = scatterers(100, 20)
  const extent = [-2, 22, -2, 22] as const
  await bench('map 128², no broadening', () => scatteringMap(new ScatteringAtEnergy(xy, waveNumber(0, 0, cu.E0_eV, cu.m_eff), BLACK_DOT), 128, extent), { runs: 5, target_ms: 1000 })
  await bench('map 128², broadening 0.02 eV (complex k)', () => scatteringMap(new ScatteringAtEnergy(xy, waveNumber(0, 0.02, cu.E0_eV, cu.m_eff), BLACK_DOT), 128, extent), { runs: 5, target_ms: 1000 })
  const E = Array.from({ length: 200 }, (_, i) => -0.5 + (0.7 * i) / 199)
  await bench('spectrum 200 pts, no broadening', () => scatteringSpectrum(xy, [10, 10], E, { ...cu, hwhm_eV: 0, a: BLACK_DOT }), { runs: 5, target_ms: 500 })
  await bench('spectrum 200 pts, broadening 0.02 eV', () => scatteringSpectrum(xy, [10, 10], E, { ...cu, hwhm_eV: 0.02, a: BLACK_DOT }), { runs: 5, target_ms: 500 })

  section('building blocks')
  const n = 100
  const r = rng(3)
  const ar = Float64Array.from({ length: n * n }, r)
  const ai = Float64Array.from({ length: n * n }, r)
  const br = Float64Array.from({ length: n }, r)
  const bi = Float64Array.from({ length: n }, r)
  const fr = new Float64Array(n * n)
  const fi = new Float64Array(n * n)
  const xr = new Float64Array(n)
  const xi = new Float64Array(n)
  const piv = new Int32Array(n)
  await bench('complex LU + solve 100 × 100, own (Float64Array)', () => {
    fr.set(ar)
    fi.set(ai)
    xr.set(br)
    xi.set(bi)
    luFactor(n, fr, fi, piv)
    luSolve(n, fr, fi, piv, xr, xi)
  }, { runs: 21 })
  const A = math.matrix(Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => math.complex(ar[i * n + j]!, ai[i * n + j]!))))
  const b = math.matrix(Array.from({ length: n }, (_, i) => [math.complex(br[i]!, bi[i]!)]))
  await bench('complex LU + solve 100 × 100, mathjs.lusolve', () => math.lusolve(A, b), { runs: 3 })
  const out = new Float64Array(2)
  const count = 1_000_000
  await bench(`H0⁽¹⁾(x) real, ${count} evaluations over x ∈ (0, 40)`, () => {
    for (let i = 0; i < count; i++) hankel1Zero(0.01 + (40 * i) / count, out)
  }, { runs: 5 })
  await bench(`H0⁽¹⁾(z) complex, ${count} evaluations, Im z = 0.05·Re z`, () => {
    for (let i = 0; i < count; i++) {
      const x = 0.01 + (40 * i) / count
      hankel1ZeroComplex(x, 0.05 * x, out)
    }
  }, { runs: 5 })

  section('wave preview in the browser: ring fit, measured spectrum')
  const rc = rng(9)
  const ring = (n: number, R: number) => Array.from({ length: n }, (_, k) => {
    const t = (2 * Math.PI * k) / n
    return [R * Math.cos(t) + (rc() - 0.5) * 0.05, R * Math.sin(t) + (rc() - 0.5) * 0.05] as [number, number]
  })
  const ring48 = ring(48, 7.13)
  const ring400 = ring(400, 40)
  await bench('fitCircle, 48 sites (Kåsa + Gauss–Newton)', () => fitCircle(ring48), { runs: 21 })
  await bench('fitCircle, 400 sites', () => fitCircle(ring400), { runs: 21 })
  const V = Array.from({ length: 4001 }, (_, i) => -0.5 + (0.7 * i) / 4000)
  const dIdV = V.map(v => lorentzian(v + 0.43, 0.005) + lorentzian(v + 0.38, 0.008) + 0.05 * (rc() - 0.5))
  await bench('findSpectrumPeaks, 4001 points, smoothing 5', () => findSpectrumPeaks(V, dIdV, { smooth: 5 }), { runs: 21 })
  const csv = `bias (V),dI/dV\n${V.map((v, i) => `${v.toFixed(5)},${dIdV[i]!.toFixed(6)}`).join('\n')}`
  await bench('parseSpectrumCsv, 4001 rows', () => parseSpectrumCsv(csv), { runs: 21 })

  section('as-built check')
  const rr = rng(7)
  const sites: [number, number][] = []
  for (let i = 0; i < 100; i++) for (let j = 0; j < 100; j++) sites.push([i * 0.5, j * 0.5])
  const found = sites.filter(() => rr() > 0.03).map(([x, y]) => [x + (rr() - 0.5) * 0.1, y + (rr() - 0.5) * 0.1] as [number, number])
  for (let i = 0; i < 200; i++) found.push([rr() * 50, rr() * 50])
  await bench(`checkAsBuilt, 10⁴ sites, ${found.length} found`, () => checkAsBuilt({ sites, found }), { runs: 7 })
}
