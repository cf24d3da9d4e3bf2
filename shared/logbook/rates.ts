// Move success rates from the logbook: the fraction of attempts that ended `placed`, by move
// length, by drag direction relative to the lattice (angle modulo the lattice's rotational
// symmetry), and by the manipulation parameters, plus a forecast for a route from those rates.
// `skipped` is not an attempt. Rates are plain frequencies with a Wilson score interval (Wilson,
// J. Am. Stat. Assoc. 22, 209 (1927)) so that small bins show how little they say.
import type { Outcome, Point } from './types'
import { OUTCOMES } from './types'

/** Below this many attempts the lab's rates are shown but not used for forecasts (a choice). */
export const MIN_ATTEMPTS_FOR_FORECAST = 30
/** A length bin needs this many attempts before its own rate replaces the overall rate. */
export const MIN_ATTEMPTS_PER_BIN = 10
/** Bin edges of the move length, nm. */
export const LENGTH_EDGES_NM = [0, 0.5, 1, 2, 3, 5, 8, 13, Infinity] as const
/** The success rate used in a forecast is never taken below this (keeps expected time finite). */
export const MIN_FORECAST_RATE = 0.05

export interface Attempt {
  outcome: Outcome
  length_nm: number
  /** Drag direction relative to a1, reduced modulo symmetry_deg; null without a lattice. */
  angle_deg: number | null
  symmetry_deg: number | null
  bias_V: number | null
  setpoint_A: number | null
}

export interface RateCell { attempts: number, placed: number, rate: number | null, low: number | null, high: number | null }
export interface LengthBin extends RateCell { from_nm: number, to_nm: number | null }
export interface DirectionBin extends RateCell { from_deg: number, to_deg: number }
export interface ParamBin extends RateCell { value: number }

export interface Rates extends RateCell {
  counts: Record<Outcome, number>
  enough: boolean
  min_attempts: number
  by_length: LengthBin[]
  by_direction: { symmetry_deg: number, bins: DirectionBin[] }[]
  by_bias: ParamBin[]
  by_setpoint: ParamBin[]
}

/** Wilson score interval at 95 % (z = 1.96). */
export function wilson(placed: number, n: number, z = 1.96): [number, number] | null {
  if (n === 0) return null
  const p = placed / n
  const z2 = z * z
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n)
  const half = (z / (1 + z2 / n)) * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))
  return [Math.max(0, centre - half), Math.min(1, centre + half)]
}

function cell(placed: number, attempts: number): RateCell {
  const ci = wilson(placed, attempts)
  return { attempts, placed, rate: attempts ? placed / attempts : null, low: ci?.[0] ?? null, high: ci?.[1] ?? null }
}

/** Rotational symmetry of a 2-D lattice from its cell vectors: 60° (hexagonal), 90° (square), else 180°. */
export function latticeSymmetry(a1: Point, a2: Point): number {
  const l1 = Math.hypot(a1[0], a1[1]), l2 = Math.hypot(a2[0], a2[1])
  const cos = (a1[0] * a2[0] + a1[1] * a2[1]) / (l1 * l2)
  const equal = Math.abs(l1 - l2) < 0.02 * Math.max(l1, l2)
  if (equal && Math.abs(Math.abs(cos) - 0.5) < 0.02) return 60
  if (equal && Math.abs(cos) < 0.02) return 90
  return 180
}

/** Direction of a move's displacement (first to last path point) relative to a1, modulo the symmetry. */
export function moveDirection(path: readonly Point[], a1: Point, symmetry_deg: number): number | null {
  const p0 = path[0], p1 = path[path.length - 1]
  if (!p0 || !p1) return null
  const dx = p1[0] - p0[0], dy = p1[1] - p0[1]
  if (Math.hypot(dx, dy) < 1e-9) return null
  const deg = ((Math.atan2(dy, dx) - Math.atan2(a1[1], a1[0])) * 180) / Math.PI
  const r = ((deg % symmetry_deg) + symmetry_deg) % symmetry_deg
  // A displacement exactly along a lattice direction may come out a hair below the period.
  return symmetry_deg - r < 1e-6 ? 0 : r
}

function lengthBin(length_nm: number): number {
  for (let k = 0; k < LENGTH_EDGES_NM.length - 1; k++) if (length_nm < LENGTH_EDGES_NM[k + 1]!) return k
  return LENGTH_EDGES_NM.length - 2
}

function groupBy(attempts: readonly Attempt[], key: (a: Attempt) => number | null): ParamBin[] {
  const groups = new Map<number, { placed: number, n: number }>()
  for (const a of attempts) {
    const k = key(a)
    if (k === null) continue
    const g = groups.get(k) ?? { placed: 0, n: 0 }
    g.n++
    if (a.outcome === 'placed') g.placed++
    groups.set(k, g)
  }
  return [...groups].sort((x, y) => x[0] - y[0]).map(([value, g]) => ({ value, ...cell(g.placed, g.n) }))
}

// Parameters are grouped at the resolution they are set with: bias to 1 mV, current to 2 digits.
const roundBias = (v: number | null) => v === null ? null : Math.round(v * 1000) / 1000
const roundCurrent = (v: number | null) => v === null || v <= 0 ? null : Number(v.toPrecision(2))

export function tallyRates(all: readonly Attempt[]): Rates {
  const counts = Object.fromEntries(OUTCOMES.map(o => [o, 0])) as Record<Outcome, number>
  for (const a of all) counts[a.outcome]++
  const attempts = all.filter(a => a.outcome !== 'skipped')
  const placed = attempts.filter(a => a.outcome === 'placed').length
  const lengths = LENGTH_EDGES_NM.slice(0, -1).map(() => ({ placed: 0, n: 0 }))
  for (const a of attempts) {
    const b = lengths[lengthBin(a.length_nm)]!
    b.n++
    if (a.outcome === 'placed') b.placed++
  }
  const symmetries = [...new Set(attempts.map(a => a.symmetry_deg).filter((s): s is number => s !== null))].sort((x, y) => x - y)
  const by_direction = symmetries.map((sym) => {
    const width = sym / 6
    const bins = Array.from({ length: 6 }, () => ({ placed: 0, n: 0 }))
    for (const a of attempts) {
      if (a.symmetry_deg !== sym || a.angle_deg === null) continue
      const b = bins[Math.min(5, Math.floor(a.angle_deg / width))]!
      b.n++
      if (a.outcome === 'placed') b.placed++
    }
    return { symmetry_deg: sym, bins: bins.map((b, k) => ({ from_deg: k * width, to_deg: (k + 1) * width, ...cell(b.placed, b.n) })) }
  })
  return {
    ...cell(placed, attempts.length),
    counts,
    enough: attempts.length >= MIN_ATTEMPTS_FOR_FORECAST,
    min_attempts: MIN_ATTEMPTS_FOR_FORECAST,
    by_length: lengths.map((b, k) => ({ from_nm: LENGTH_EDGES_NM[k]!, to_nm: Number.isFinite(LENGTH_EDGES_NM[k + 1]!) ? LENGTH_EDGES_NM[k + 1]! : null, ...cell(b.placed, b.n) })),
    by_direction,
    by_bias: groupBy(attempts, a => roundBias(a.bias_V)),
    by_setpoint: groupBy(attempts, a => roundCurrent(a.setpoint_A)),
  }
}

export interface Forecast {
  /** False until the lab has MIN_ATTEMPTS_FOR_FORECAST attempts: then the other fields are null. */
  enough: boolean
  based_on_attempts: number
  moves: number
  expected_placed: number | null
  planned_s: number
  expected_s: number | null
}

/**
 * Forecast for the moves still to do. Each move succeeds with the rate of its length bin (the
 * overall rate where the bin has fewer than MIN_ATTEMPTS_PER_BIN attempts); expected placed atoms
 * is the sum of those rates. A failed attempt is taken to cost about the move's planned time, so a
 * move with success rate p takes on average planned ÷ p (mean of a geometric number of tries).
 */
export function forecastMoves(moves: readonly { length_nm: number, estimate_s?: number }[], rates: Rates): Forecast {
  const planned_s = moves.reduce((s, m) => s + (m.estimate_s ?? 0), 0)
  if (!rates.enough || rates.rate === null) return { enough: false, based_on_attempts: rates.attempts, moves: moves.length, expected_placed: null, planned_s, expected_s: null }
  let expected_placed = 0, expected_s = 0
  for (const m of moves) {
    const bin = rates.by_length[lengthBin(m.length_nm)]
    const p = bin && bin.attempts >= MIN_ATTEMPTS_PER_BIN && bin.rate !== null ? bin.rate : rates.rate
    expected_placed += p
    expected_s += (m.estimate_s ?? 0) / Math.max(MIN_FORECAST_RATE, p)
  }
  return { enough: true, based_on_attempts: rates.attempts, moves: moves.length, expected_placed, planned_s, expected_s }
}
