// Grey levels → heights in nm: z = level·nm_per_level, or the format's full level range
// [min, max] mapped linearly onto [0, z_range_nm]. Float TIFFs and text grids already hold nm
// and take only an optional factor. Browser-safe.
import { InputError } from '../errors'
import type { Grid, RawScan } from './types'

export type HeightScale = { nm_per_level: number } | { z_range_nm: number } | { factor?: number }

export function toHeights(raw: RawScan, scale: HeightScale = {}): Grid {
  const n = raw.width * raw.height
  const out = new Float32Array(n)
  const src = raw.data
  let a: number // z = a·v + b
  let b = 0
  const has = (k: string) => k in scale && (scale as Record<string, unknown>)[k] !== undefined
  if (raw.valueUnit === 'level') {
    if (has('nm_per_level')) {
      a = positive((scale as { nm_per_level: number }).nm_per_level, 'nm_per_level')
    }
    else if (has('z_range_nm')) {
      const z = positive((scale as { z_range_nm: number }).z_range_nm, 'z_range_nm')
      const [lo, hi] = raw.levelRange ?? [0, 2 ** raw.bitDepth - 1]
      a = z / (hi - lo)
      b = -lo * a
    }
    else {
      throw new InputError('scale', `this ${raw.format.toUpperCase()} holds grey levels, not heights: give nm_per_level or z_range_nm`)
    }
  }
  else {
    if (has('nm_per_level') || has('z_range_nm')) {
      throw new InputError('scale', 'this scan already holds heights in nm: give only an optional factor')
    }
    const f = has('factor') ? (scale as { factor: number }).factor : 1
    if (typeof f !== 'number' || !Number.isFinite(f) || f === 0) throw new InputError('factor', 'factor must be a finite number other than 0')
    a = f
  }
  for (let i = 0; i < n; i++) out[i] = a * src[i]! + b
  return { width: raw.width, height: raw.height, data: out }
}

function positive(v: unknown, field: string): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new InputError(field, `${field} must be a finite number greater than 0`)
  return v
}
