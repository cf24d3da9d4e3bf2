// Test helper: Gauss–Legendre nodes and weights on [a, b] (Golub & Welsch / the classic Newton
// iteration on P_n with the asymptotic initial guess cos(π(i − 1/4)/(n + 1/2))), composite over panels.

export function gaussLegendre(n: number): { x: Float64Array, w: Float64Array } {
  const x = new Float64Array(n)
  const w = new Float64Array(n)
  for (let i = 0; i < Math.ceil(n / 2); i++) {
    let z = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5))
    let dp = 0
    for (let it = 0; it < 100; it++) {
      let p0 = 1
      let p1 = z
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * z * p1 - (k - 1) * p0) / k
        p0 = p1
        p1 = p2
      }
      dp = (n * (z * p1 - p0)) / (z * z - 1)
      const dz = p1 / dp
      z -= dz
      if (Math.abs(dz) < 1e-16) break
    }
    x[i] = -z
    x[n - 1 - i] = z
    w[i] = 2 / ((1 - z * z) * dp * dp)
    w[n - 1 - i] = w[i]!
  }
  return { x, w }
}

/** ∫_a^b f by `panels` Gauss–Legendre panels of `order` nodes. */
export function integrate(f: (t: number) => number, a: number, b: number, panels = 40, order = 20): number {
  const { x, w } = gaussLegendre(order)
  const h = (b - a) / panels
  let s = 0
  for (let p = 0; p < panels; p++) {
    const c = a + (p + 0.5) * h
    for (let i = 0; i < order; i++) s += w[i]! * f(c + (x[i]! * h) / 2)
  }
  return (s * h) / 2
}
