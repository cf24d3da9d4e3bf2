// Number formats of the night's screens: every length in nm, bias in mV, current in pA/nA, with
// the unit always shown.
import type { Outcome } from '#shared/logbook/types'

type Pt = readonly [number, number]

export const fmtNm = (v: number | null | undefined, digits = 3) => v === null || v === undefined || !Number.isFinite(v) ? '—' : `${v.toFixed(digits)} nm`
export const fmtXY = (p: Pt | null | undefined, digits = 3) => p ? `${p[0].toFixed(digits)}, ${p[1].toFixed(digits)} nm` : '—'
export const fmtBias = (V: number | null | undefined) => V === null || V === undefined ? '—' : `${+(V * 1000).toPrecision(4)} mV`
export function fmtCurrent(A: number | null | undefined): string {
  if (A === null || A === undefined) return '—'
  return A >= 1e-9 ? `${+(A * 1e9).toPrecision(3)} nA` : `${+(A * 1e12).toPrecision(3)} pA`
}
export const fmtPct = (f: number | null | undefined, digits = 0) => f === null || f === undefined ? '—' : `${(f * 100).toFixed(digits)} %`
export function fmtDuration(s: number | null | undefined): string {
  if (s === null || s === undefined || !Number.isFinite(s)) return '—'
  const m = Math.round(s / 60)
  return m < 60 ? `${m} min` : `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`
}
export const fmtTime = (d: string | null | undefined) => d ? new Date(d).toLocaleString(undefined, { dateStyle: 'short', timeStyle: 'short' }) : '—'

/** Keyboard shortcut of each outcome (shown on its button). */
export const OUTCOME_KEYS: Record<Outcome, string> = { 'placed': 'P', 'stayed': 'S', 'off-site': 'O', 'lost': 'L', 'tip-change': 'T', 'skipped': 'X' }

/** Tailwind classes of each outcome: text/border colour for chips, a fill for the big buttons. */
export const OUTCOME_TONE: Record<Outcome, { chip: string, button: string }> = {
  'placed': { chip: 'border-ok/60 text-ok', button: 'border-ok/70 bg-ok/15 text-ok hover:bg-ok/25' },
  'stayed': { chip: 'border-line text-ink', button: 'border-line bg-raised text-ink hover:border-dim' },
  'off-site': { chip: 'border-warn/60 text-warn', button: 'border-warn/70 bg-warn/10 text-warn hover:bg-warn/20' },
  'lost': { chip: 'border-bad/60 text-bad', button: 'border-bad/70 bg-bad/10 text-bad hover:bg-bad/20' },
  'tip-change': { chip: 'border-info/60 text-info', button: 'border-info/70 bg-info/10 text-info hover:bg-info/20' },
  'skipped': { chip: 'border-line text-dim', button: 'border-line bg-transparent text-dim hover:border-dim hover:text-ink' },
}
