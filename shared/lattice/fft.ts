// Iterative radix-2 Cooley–Tukey FFT on split real/imaginary Float64Arrays, and a 2-D row–column
// transform. Own code because mathjs.fft on nested arrays took 1314 ms for 256² and 5789 ms for
// 512² here (Node 20, measured); this one is quoted in tests/bench/lattice.bench.ts.

const twiddles = new Map<number, { cos: Float64Array, sin: Float64Array, rev: Uint32Array }>()

function plan(n: number) {
  let p = twiddles.get(n)
  if (p) return p
  const cos = new Float64Array(n / 2)
  const sin = new Float64Array(n / 2)
  for (let k = 0; k < n / 2; k++) {
    cos[k] = Math.cos(-2 * Math.PI * k / n)
    sin[k] = Math.sin(-2 * Math.PI * k / n)
  }
  const rev = new Uint32Array(n)
  const bits = Math.round(Math.log2(n))
  for (let k = 0; k < n; k++) {
    let r = 0
    for (let b = 0; b < bits; b++) r |= ((k >> b) & 1) << (bits - 1 - b)
    rev[k] = r
  }
  p = { cos, sin, rev }
  twiddles.set(n, p)
  return p
}

export function isPowerOfTwo(n: number): boolean {
  return Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0
}

export function nextPowerOfTwo(n: number): number {
  let p = 1
  while (p < n) p *= 2
  return p
}

/** In-place forward DFT X_k = Σ x_n·e^{−2πi kn/N}; n must be a power of two. */
export function fft(re: Float64Array, im: Float64Array): void {
  const n = re.length
  if (!isPowerOfTwo(n) || im.length !== n) throw new RangeError('fft: length must be a power of two and re/im must match')
  const { cos, sin, rev } = plan(n)
  for (let k = 0; k < n; k++) {
    const r = rev[k]!
    if (r > k) {
      const tr = re[k]!
      re[k] = re[r]!
      re[r] = tr
      const ti = im[k]!
      im[k] = im[r]!
      im[r] = ti
    }
  }
  for (let size = 2; size <= n; size *= 2) {
    const half = size / 2
    const stride = n / size
    for (let start = 0; start < n; start += size) {
      for (let k = 0; k < half; k++) {
        const wr = cos[k * stride]!
        const wi = sin[k * stride]!
        const a = start + k
        const b = a + half
        const xr = re[b]! * wr - im[b]! * wi
        const xi = re[b]! * wi + im[b]! * wr
        re[b] = re[a]! - xr
        im[b] = im[a]! - xi
        re[a]! += xr
        im[a]! += xi
      }
    }
  }
}

/** In-place 2-D forward DFT of a row-major nx × ny array (both powers of two). */
export function fft2(re: Float64Array, im: Float64Array, nx: number, ny: number): void {
  const rr = new Float64Array(nx)
  const ri = new Float64Array(nx)
  for (let r = 0; r < ny; r++) {
    rr.set(re.subarray(r * nx, (r + 1) * nx))
    ri.set(im.subarray(r * nx, (r + 1) * nx))
    fft(rr, ri)
    re.set(rr, r * nx)
    im.set(ri, r * nx)
  }
  const cr = new Float64Array(ny)
  const ci = new Float64Array(ny)
  for (let c = 0; c < nx; c++) {
    for (let r = 0; r < ny; r++) {
      cr[r] = re[r * nx + c]!
      ci[r] = im[r * nx + c]!
    }
    fft(cr, ci)
    for (let r = 0; r < ny; r++) {
      re[r * nx + c] = cr[r]!
      im[r * nx + c] = ci[r]!
    }
  }
}
