// Separable Gaussian smoothing: sampled kernel exp(−i²/2σ²), truncated at 3σ and normalised to
// unit sum, applied along rows and then columns with edge samples repeated past the border.
// Direct convolution; cost (2·radius + 1) multiply-adds per pixel and pass.

export interface Kernel {
  /** Half-kernel: weights[0] is the centre, weights[i] the weight at ±i. */
  weights: Float32Array
  radius: number
  /** Σ w_i·i² over the full kernel (px²): the kernel's own variance. */
  variance_px2: number
  /** Σ w_i² over the full kernel: white-noise gain of the filter. */
  sumSquares: number
}

export function gaussianKernel(sigma_px: number): Kernel {
  const radius = Math.max(1, Math.ceil(3 * sigma_px))
  const w = new Float64Array(radius + 1)
  let sum = 0
  for (let i = 0; i <= radius; i++) {
    w[i] = Math.exp(-(i * i) / (2 * sigma_px * sigma_px))
    sum += i === 0 ? w[i]! : 2 * w[i]!
  }
  const weights = new Float32Array(radius + 1)
  let variance_px2 = 0
  let sumSquares = 0
  for (let i = 0; i <= radius; i++) {
    const v = w[i]! / sum
    weights[i] = v
    variance_px2 += (i === 0 ? 0 : 2) * v * i * i
    sumSquares += (i === 0 ? 1 : 2) * v * v
  }
  return { weights, radius, variance_px2, sumSquares }
}

/** Smooths a w × h grid along rows with kx, then along columns with ky. Returns a new array. */
export function smoothSeparable(src: Float32Array, w: number, h: number, kx: Kernel, ky: Kernel): Float32Array {
  const tmp = new Float32Array(w * h)
  smoothRows(src, tmp, w, h, kx)
  const out = new Float32Array(w * h)
  smoothColumns(tmp, out, w, h, ky)
  return out
}

function smoothRows(src: Float32Array, dst: Float32Array, w: number, h: number, k: Kernel) {
  const R = k.radius
  const kw = k.weights
  const buf = new Float32Array(w + 2 * R)
  for (let r = 0; r < h; r++) {
    const base = r * w
    const first = src[base]!
    const last = src[base + w - 1]!
    for (let i = 0; i < R; i++) {
      buf[i] = first
      buf[R + w + i] = last
    }
    buf.set(src.subarray(base, base + w), R)
    const k0 = kw[0]!
    for (let c = 0; c < w; c++) {
      const m = c + R
      let acc = k0 * buf[m]!
      for (let i = 1; i <= R; i++) acc += kw[i]! * (buf[m - i]! + buf[m + i]!)
      dst[base + c] = acc
    }
  }
}

// Row-wise accumulation keeps the inner loop on contiguous memory.
function smoothColumns(src: Float32Array, dst: Float32Array, w: number, h: number, k: Kernel) {
  const R = k.radius
  const kw = k.weights
  for (let r = 0; r < h; r++) {
    const out = r * w
    const k0 = kw[0]!
    for (let c = 0; c < w; c++) dst[out + c] = k0 * src[out + c]!
    for (let i = 1; i <= R; i++) {
      const up = Math.max(r - i, 0) * w
      const down = Math.min(r + i, h - 1) * w
      const ki = kw[i]!
      for (let c = 0; c < w; c++) dst[out + c]! += ki * (src[up + c]! + src[down + c]!)
    }
  }
}
