// Sub-pixel refinement of detected peaks: Gaussian least-squares fits (fit.ts) on the unsmoothed
// samples, in two rounds — alone, then with the first-round models of the neighbours within reach
// subtracted from each window, which removes most of the pull of close neighbours' tails.
import { BucketGrid } from './buckets'
import { GaussFitter, type GaussFit } from './fit'

/** Window radius in σ of the fitted Gaussian. */
const RHO = 2.5

export function refinePeaks(data: Float32Array, w: number, h: number, xs: number[], ys: number[], sx: number, sy: number): (GaussFit | null)[] {
  const fitter = new GaussFitter(data, w, h, sx, sy, RHO)
  // Raster order keeps successive windows in the same rows of memory (measured 20–25 % faster on
  // a 2048² grid than prominence order); results go back to their input positions.
  const order = xs.map((_, i) => i).sort((a, b) => Math.round(ys[a]!) - Math.round(ys[b]!) || xs[a]! - xs[b]!)
  const first: (GaussFit | null)[] = new Array(xs.length)
  for (const i of order) first[i] = fitter.fit(xs[i]!, ys[i]!)
  // A neighbour matters when its tail (1 % at 3σ) reaches into the window.
  const reach = RHO + 3
  const cellX = sx * reach, cellY = sy * reach
  const buckets = new BucketGrid(w / cellX, h / cellY)
  first.forEach((f, i) => {
    if (f) buckets.add(i, f.x0 / cellX, f.y0 / cellY)
  })
  let nbs = new Float64Array(3 * 16)
  const reach2 = reach * reach
  const out: (GaussFit | null)[] = new Array(xs.length)
  for (const i of order) {
    const f = first[i]
    if (!f) {
      out[i] = null
      continue
    }
    let n = 0
    const qx = Math.floor(f.x0 / cellX), qy = Math.floor(f.y0 / cellY)
    for (let j = qy - 1; j <= qy + 1; j++) {
      for (let q = qx - 1; q <= qx + 1; q++) {
        for (let m = buckets.first(q, j); m >= 0; m = buckets.after(m)) {
          const g = first[m]!
          if (m === i || ((g.x0 - f.x0) / sx) ** 2 + ((g.y0 - f.y0) / sy) ** 2 >= reach2) continue
          if (3 * n + 3 > nbs.length) {
            const grown = new Float64Array(2 * nbs.length)
            grown.set(nbs)
            nbs = grown
          }
          nbs[3 * n] = g.x0
          nbs[3 * n + 1] = g.y0
          nbs[3 * n + 2] = g.A
          n++
        }
      }
    }
    // Starting from the first-round centre, the second round needs only a step or two.
    out[i] = n === 0 ? f : fitter.fit(f.x0, f.y0, nbs, n) ?? f
  }
  return out
}
