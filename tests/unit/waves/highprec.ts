// Test helper, independent of the code under test: J_m(x), Y0(x), Y1(x) from their power series
// (Abramowitz & Stegun 9.1.10, 9.1.13, 9.1.11) in 70-digit fixed-point BigInt arithmetic, for
// x = p/q exactly. π comes from Machin's formula, ln from the atanh series; Euler's γ to 50 digits
// from memory (0.57721566490153286060651209008240243104215933593992, matches DLMF 5.2.3's digits).

const P = 70n
const S = 10n ** P

function atanhInv(n: bigint): bigint {
  // atanh(1/n) = Σ 1/((2i+1) n^(2i+1))
  let term = S / n
  let sum = 0n
  const n2 = n * n
  for (let i = 0n; term !== 0n; i++) {
    sum += term / (2n * i + 1n)
    term /= n2
  }
  return sum
}

function atanInv(n: bigint): bigint {
  let term = S / n
  let sum = 0n
  const n2 = n * n
  for (let i = 0n; term !== 0n; i++) {
    const t = term / (2n * i + 1n)
    sum += i % 2n === 0n ? t : -t
    term /= n2
  }
  return sum
}

const PI = 16n * atanInv(5n) - 4n * atanInv(239n)
const LN2 = 2n * atanhInv(3n)
const GAMMA = BigInt('57721566490153286060651209008240243104215933593992') * 10n ** (P - 50n)

/** ln(p/q) for positive integers p, q. */
function lnFrac(p: bigint, q: bigint): bigint {
  // p/q = 2^e · r with r in [1, 2): ln r = 2 atanh((r−1)/(r+1)) = 2 atanh((p' − q')/(p' + q'))
  let e = 0n
  let pp = p
  let qq = q
  while (pp >= 2n * qq) {
    qq *= 2n
    e++
  }
  while (pp < qq) {
    pp *= 2n
    e--
  }
  const num = pp - qq
  const den = pp + qq
  // atanh(z) = Σ z^(2i+1)/(2i+1) with z = num/den in fixed point
  const z = (num * S) / den
  let term = z
  let sum = 0n
  const z2 = (z * z) / S
  for (let i = 0n; term !== 0n; i++) {
    sum += term / (2n * i + 1n)
    term = (term * z2) / S
  }
  return e * LN2 + 2n * sum
}

const toNumber = (a: bigint): number => Number(a) / Number(S)

/** J_m(p/q) = Σ_k (−1)^k (x/2)^(2k+m) / (k!(k+m)!). */
function jFixed(m: number, p: bigint, q: bigint): bigint {
  const h = (p * S) / (2n * q) // x/2
  const h2 = (h * h) / S
  let t = S
  for (let i = 1n; i <= BigInt(m); i++) t = (t * h) / S / i
  let sum = 0n
  const mb = BigInt(m)
  for (let k = 1n; t !== 0n; k++) {
    sum += t
    t = -((t * h2) / S) / (k * (k + mb))
  }
  return sum
}

export function besselJHighPrec(m: number, p: bigint, q: bigint): number {
  return toNumber(jFixed(m, p, q))
}

/** Y0(x) = (2/π)[(ln(x/2) + γ) J0(x) + Σ_{k≥1} (−1)^(k+1) H_k (x²/4)^k/(k!)²]. */
export function besselY0HighPrec(p: bigint, q: bigint): number {
  const h = (p * S) / (2n * q)
  const h2 = (h * h) / S
  const lg = lnFrac(p, 2n * q) + GAMMA
  let sum = (lg * jFixed(0, p, q)) / S
  let u = S
  let H = 0n
  for (let k = 1n; ; k++) {
    u = (u * h2) / S / (k * k)
    H += S / k
    if (u === 0n) break
    const t = (H * u) / S
    sum += k % 2n === 1n ? t : -t
  }
  return toNumber((2n * S * sum) / PI)
}

/** Y1(x) = −2/(πx) + (2/π) ln(x/2) J1(x) − (1/π) Σ_{k≥0} (−1)^k [ψ(k+1) + ψ(k+2)] (x/2)^(2k+1)/(k!(k+1)!),
 * ψ(n+1) = −γ + H_n. */
export function besselY1HighPrec(p: bigint, q: bigint): number {
  const h = (p * S) / (2n * q)
  const h2 = (h * h) / S
  const x = (p * S) / q
  let sum = 0n
  let v = h // k = 0: (x/2)/(0!·1!)
  let Hk = 0n // H_k
  for (let k = 0n; v !== 0n; k++) {
    const Hk1 = Hk + S / (k + 1n)
    const psi = -2n * GAMMA + Hk + Hk1
    const t = (psi * v) / S
    sum += k % 2n === 0n ? t : -t
    v = (v * h2) / S / ((k + 1n) * (k + 2n))
    Hk = Hk1
  }
  const first = -(2n * S * S) / ((PI * x) / S) // −2/(πx)
  const second = (2n * S * ((lnFrac(p, 2n * q) * jFixed(1, p, q)) / S)) / PI
  const third = -(S * sum) / PI
  return toNumber(first + second + third)
}
