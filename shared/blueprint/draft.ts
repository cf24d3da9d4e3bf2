// Live expansion of a blueprint being drawn: each shape is expanded on its own (so one shape that
// cannot be built names its own field and leaves the others drawn), then merged in shape order
// with the first occurrence of a site kept, and the spacing rules run over the merged sites.
import { isInputError } from '../errors'
import type { Surface } from '../lattice/surfaces'
import { type BlueprintSite, expandBlueprint, siteKey } from './expand'
import { type RuleIssue, checkRules } from './rules'
import { type Bounds, Shape } from './schema'

export interface ShapeProblem { field: string, message: string }

export interface DraftShapeResult {
  sites: BlueprintSite[]
  /** Targets before de-duplication within the shape. */
  targets: number
  maxDeviation_nm: number
  error?: ShapeProblem
}

export interface DraftExpansion {
  sites: (BlueprintSite & { shape: number })[]
  perShape: DraftShapeResult[]
  /** A site produced again by a later (or the same) shape. */
  duplicates: { shape: number, site: [number, number, number], firstShape: number }[]
  /** Too-close pairs and sites outside the bounds, indices into `sites`. */
  issues: RuleIssue[]
  maxDeviation_nm: number
}

export interface DraftOptions { minSpacing_nm: number, bounds?: Bounds }

/** Per-shape results keyed by the (immutable) shape object and the options they were made with. */
export type DraftCache = WeakMap<object, { key: string, result: DraftShapeResult }>
export const createDraftCache = (): DraftCache => new WeakMap()

function optionsKey(surface: string | Surface, site: string | undefined, o: DraftOptions): string {
  return `${typeof surface === 'string' ? surface : surface.id}|${site ?? ''}|${o.minSpacing_nm}|${o.bounds ? JSON.stringify(o.bounds) : ''}`
}

/** Strips the 'shapes[0].' prefix the core puts on a field. */
const localField = (field: string) => field.replace(/^shapes\[\d+\]\.?/, '') || 'shape'

/** Expands one shape; a shape that cannot be built gives its problem instead of throwing. */
export function expandOne(shape: Shape, surface: string | Surface, site: string | undefined, o: DraftOptions): DraftShapeResult {
  const parsed = Shape.safeParse(shape)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    return { sites: [], targets: 0, maxDeviation_nm: 0, error: { field: issue.path.map(String).join('.') || 'shape', message: issue.message } }
  }
  try {
    const e = expandBlueprint([parsed.data], surface, site, { minSpacing_nm: o.minSpacing_nm, bounds: o.bounds })
    return { sites: e.sites, targets: e.perShape[0]!.targets, maxDeviation_nm: e.maxDeviation_nm }
  }
  catch (err) {
    if (!isInputError(err)) throw err
    return { sites: [], targets: 0, maxDeviation_nm: 0, error: { field: localField(err.field), message: err.message } }
  }
}

/** The problem a shape would have, or null when it can be built (for refusing a bad edit). */
export function shapeProblem(shape: Shape, surface: string | Surface, site: string | undefined, o: DraftOptions): ShapeProblem | null {
  return expandOne(shape, surface, site, o).error ?? null
}

export function expandDraft(shapes: readonly Shape[], surface: string | Surface, site: string | undefined, o: DraftOptions, cache?: DraftCache): DraftExpansion {
  const key = optionsKey(surface, site, o)
  const out: DraftExpansion = { sites: [], perShape: [], duplicates: [], issues: [], maxDeviation_nm: 0 }
  const first = new Map<string, number>()
  shapes.forEach((shape, k) => {
    const hit = cache?.get(shape)
    const r = hit && hit.key === key ? hit.result : expandOne(shape, surface, site, o)
    if (cache && r !== hit?.result) cache.set(shape, { key, result: r })
    out.perShape.push(r)
    out.maxDeviation_nm = Math.max(out.maxDeviation_nm, r.maxDeviation_nm)
    for (const s of r.sites) {
      const sk = siteKey(s.i, s.j, s.b)
      const prev = first.get(sk)
      if (prev !== undefined) {
        out.duplicates.push({ shape: k, site: [s.i, s.j, s.b], firstShape: prev })
        continue
      }
      first.set(sk, k)
      out.sites.push({ ...s, shape: k })
    }
  })
  out.issues = out.sites.length ? checkRules(out.sites, { minSpacing_nm: o.minSpacing_nm, bounds: o.bounds }) : []
  return out
}
