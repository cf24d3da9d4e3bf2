// The state of a build run, derived from its append-only logbook: the effective entries (an
// entry corrected by a later one no longer counts; the correction takes its place in the order),
// replayed over the atoms' starting positions, give where every atom is now, which sites hold
// their atom, and which move of the current route comes next.
import { InputError } from '../errors'
import { ADVANCING, OUTCOMES, REPLAN_AFTER, type EntrySnap, type Outcome, type Point, type RouteSnap, type RunState } from './types'

const fmt = (p: Point) => `(${p[0].toFixed(3)}, ${p[1].toFixed(3)}) nm`

/** Route ids from the run's first route to the current one, following parent links. */
export function routeChain(routes: ReadonlyMap<number, RouteSnap>, firstId: number, currentId: number): number[] {
  const chain: number[] = []
  let id: number | null = currentId
  while (id !== null) {
    chain.push(id)
    if (id === firstId) return chain.reverse()
    if (chain.length > 100_000) break
    id = routes.get(id)?.parent_id ?? null
  }
  throw new InputError('current_route_id', `route ${currentId} does not descend from the run's first route ${firstId}`)
}

/** Seq of the entry at the start of each correction chain: a correction replays in that slot. */
function slotSeqs(entries: readonly EntrySnap[]): Map<number, number> {
  const byId = new Map(entries.map(e => [e.id, e]))
  const slot = new Map<number, number>()
  for (const e of entries) {
    let cur = e
    for (let hops = 0; cur.supersedes !== null && hops < entries.length; hops++) {
      const prev = byId.get(cur.supersedes)
      if (!prev) break
      cur = prev
    }
    slot.set(e.id, cur.seq)
  }
  return slot
}

export function deriveRunState(routes: ReadonlyMap<number, RouteSnap>, firstId: number, currentId: number, entries: readonly EntrySnap[]): RunState {
  const chain = routeChain(routes, firstId, currentId)
  const inChain = new Set(chain)
  const current = routes.get(currentId)!
  const superseded_by: Record<number, number> = {}
  for (const e of entries) if (e.supersedes !== null) superseded_by[e.supersedes] ??= e.id
  const effective = entries.filter(e => superseded_by[e.id] === undefined)
  const slot = slotSeqs(entries)
  effective.sort((a, b) => slot.get(a.id)! - slot.get(b.id)! || a.seq - b.seq)

  // Positions restart at the latest anchor (the run's first route, or a re-plan from a newer scan).
  let anchorIdx = 0
  for (let k = chain.length - 1; k > 0; k--) {
    if (routes.get(chain[k]!)!.anchor) {
      anchorIdx = k
      break
    }
  }
  const anchor = routes.get(chain[anchorIdx]!)!
  const anchorBase = anchorIdx === 0 ? 0 : anchor.base_seq
  const live = new Set(chain.slice(anchorIdx))
  const where = new Map<number, Point | null>()
  anchor.atoms.forEach((p, k) => where.set(anchor.atom_ids[k] ?? k, p))
  const holds = new Map<number, number>() // site → atom id
  const siteOf = new Map<number, number>() // atom id → site
  const hold = (site: number, atomId: number) => {
    const before = holds.get(site)
    if (before !== undefined) siteOf.delete(before)
    holds.set(site, atomId)
    siteOf.set(atomId, site)
  }
  const release = (atomId: number) => {
    const site = siteOf.get(atomId)
    if (site === undefined) return
    holds.delete(site)
    siteOf.delete(atomId)
  }
  for (const [s, a] of anchor.placed) hold(s, anchor.atom_ids[a] ?? a)

  const counts = Object.fromEntries(OUTCOMES.map(o => [o, 0])) as Record<Outcome, number>
  const attempts = current.moves.map(() => 0)
  const done = new Set<number>()
  let needs: RunState['needs_replan'] = null
  for (const e of effective) {
    counts[e.outcome]++
    const route = routes.get(e.route_id)
    if (!route || !inChain.has(e.route_id)) continue
    const move = route.moves[e.move_index]
    if (!move) continue
    if (e.route_id === currentId) {
      attempts[e.move_index] = (attempts[e.move_index] ?? 0) + 1
      if (ADVANCING.has(e.outcome)) done.add(e.move_index)
    }
    if (!live.has(e.route_id) || slot.get(e.id)! <= anchorBase) continue
    const atomId = route.atom_ids[move.atom] ?? move.atom
    if (e.outcome === 'placed') {
      release(atomId)
      where.set(atomId, move.path[move.path.length - 1] ?? route.sites[move.site]!)
      if (move.kind !== 'parking') hold(move.site, atomId)
    }
    else if (e.outcome === 'off-site') {
      release(atomId)
      where.set(atomId, e.position)
    }
    else if (e.outcome === 'lost') {
      release(atomId)
      where.set(atomId, null)
    }
    const corrected = e.supersedes !== null && e.route_id !== currentId
    if (e.route_id === currentId && REPLAN_AFTER.has(e.outcome)) {
      const what = e.outcome === 'off-site' ? `ended off-site at ${fmt(e.position ?? [0, 0])}` : e.outcome === 'lost' ? 'was lost' : 'was skipped and stays where it was'
      needs = { entry_id: e.id, seq: e.seq, message: `Atom ${atomId} ${what} (move ${e.move_index + 1}): re-plan the remaining moves.` }
    }
    else if (corrected && slot.get(e.id)! <= current.base_seq) {
      needs = { entry_id: e.id, seq: e.seq, message: `An entry of an earlier plan was corrected (move ${e.move_index + 1}): re-plan to take it into account.` }
    }
  }
  let current_move: number | null = null
  for (let i = 0; i < current.moves.length; i++) {
    if (!done.has(i)) {
      current_move = i
      break
    }
  }
  const atoms = [...where].map(([atom, position]) => ({ atom, position })).sort((a, b) => a.atom - b.atom)
  return {
    current_route_id: currentId,
    chain,
    current_move,
    moves_total: current.moves.length,
    done_moves: [...done].sort((a, b) => a - b),
    attempts,
    atoms,
    placed: [...holds].sort((a, b) => a[0] - b[0]),
    counts,
    entries_total: entries.length,
    last_seq: entries.reduce((m, e) => Math.max(m, e.seq), 0),
    superseded_by,
    needs_replan: needs,
  }
}

/**
 * The solver input of a re-plan from the derived state: every atom still there (lost atoms are
 * dropped, so they are neither moved nor treated as obstacles), the same sites, and the sites that
 * already hold their atom locked as placed.
 */
export function replanFromState(state: RunState, current: RouteSnap): { atoms: Point[], atom_ids: number[], sites: Point[], placed: Array<[number, number]> } {
  const present = state.atoms.filter((a): a is { atom: number, position: Point } => a.position !== null)
  const index = new Map(present.map((a, k) => [a.atom, k]))
  const placed: Array<[number, number]> = []
  for (const [s, atomId] of state.placed) {
    const k = index.get(atomId)
    if (k !== undefined && s < current.sites.length) placed.push([s, k])
  }
  return { atoms: present.map(a => a.position), atom_ids: present.map(a => a.atom), sites: current.sites, placed }
}
