// Run state from an append-only logbook, checked against positions worked out by hand for a small
// two-atom, two-site route: where each atom is after each outcome, which move is current, how a
// correction takes the place of the entry it supersedes, and what a re-plan starts from.
import { describe, expect, it } from 'vitest'
import { deriveRunState, replanFromState, type EntrySnap, type Outcome, type Point, type RouteSnap } from '../../../shared/logbook'

// Atom 0 at (0, 0) goes to site 0 at (1, 0); atom 1 at (0, 2) goes to site 1 at (1, 2); atom 2
// (a spare) sits at (5, 5).
const first: RouteSnap = {
  id: 10, parent_id: null, atoms: [[0, 0], [0, 2], [5, 5]], atom_ids: [0, 1, 2], sites: [[1, 0], [1, 2]], placed: [], base_seq: 0, anchor: false,
  moves: [
    { atom: 0, site: 0, path: [[0, 0], [1, 0]], length_nm: 1 },
    { atom: 1, site: 1, path: [[0, 2], [1, 2]], length_nm: 1 },
  ],
}
let nextId = 100
function entry(seq: number, move_index: number, outcome: Outcome, extra: Partial<EntrySnap> = {}): EntrySnap {
  return { id: nextId++, seq, route_id: 10, move_index, outcome, position: null, supersedes: null, ...extra }
}
const routes = (...r: RouteSnap[]) => new Map(r.map(x => [x.id, x]))
const pos = (s: ReturnType<typeof deriveRunState>, atom: number) => s.atoms.find(a => a.atom === atom)?.position

describe('deriveRunState', () => {
  it('starts at move 0 with every atom where the route found it', () => {
    const s = deriveRunState(routes(first), 10, 10, [])
    expect(s.current_move).toBe(0)
    expect(s.atoms).toEqual([{ atom: 0, position: [0, 0] }, { atom: 1, position: [0, 2] }, { atom: 2, position: [5, 5] }])
    expect(s.last_seq).toBe(0)
    expect(s.needs_replan).toBeNull()
  })

  it('keeps the move current after stayed and tip-change, advances after placed', () => {
    const s = deriveRunState(routes(first), 10, 10, [entry(1, 0, 'stayed'), entry(2, 0, 'tip-change'), entry(3, 0, 'placed')])
    expect(s.current_move).toBe(1)
    expect(s.attempts).toEqual([3, 0])
    // Hand computation: placed puts atom 0 on the last point of its path, site 0 at (1, 0).
    expect(pos(s, 0)).toEqual([1, 0])
    expect(s.placed).toEqual([[0, 0]])
    expect(s.counts).toMatchObject({ 'stayed': 1, 'tip-change': 1, 'placed': 1, 'lost': 0 })
  })

  it('moves an off-site atom to where it went and asks for a re-plan', () => {
    const s = deriveRunState(routes(first), 10, 10, [entry(1, 0, 'placed'), entry(2, 1, 'off-site', { position: [1.3, 2.1] })])
    expect(s.current_move).toBeNull()
    expect(pos(s, 1)).toEqual([1.3, 2.1])
    expect(s.placed).toEqual([[0, 0]])
    expect(s.needs_replan?.message).toMatch(/Atom 1 ended off-site at \(1\.300, 2\.100\) nm/)
  })

  it('lets a correction take the place of the entry it supersedes; the original stays in the record', () => {
    const placed = entry(1, 0, 'placed')
    const later = entry(2, 1, 'placed')
    const fix = entry(3, 0, 'lost', { supersedes: placed.id })
    const s = deriveRunState(routes(first), 10, 10, [placed, later, fix])
    expect(s.superseded_by).toEqual({ [placed.id]: fix.id })
    expect(s.entries_total).toBe(3)
    // Atom 0 is lost rather than on site 0; atom 1 is on site 1.
    expect(pos(s, 0)).toBeNull()
    expect(s.placed).toEqual([[1, 1]])
    expect(s.counts.placed).toBe(1)
    expect(s.counts.lost).toBe(1)
  })

  it('builds the re-plan input without lost atoms and with placed atoms locked on their sites', () => {
    const s = deriveRunState(routes(first), 10, 10, [entry(1, 0, 'placed'), entry(2, 1, 'lost')])
    const r = replanFromState(s, first)
    expect(r.atom_ids).toEqual([0, 2])
    expect(r.atoms).toEqual([[1, 0], [5, 5]] as Point[])
    expect(r.placed).toEqual([[0, 0]])
    expect(r.sites).toEqual(first.sites)
  })

  it('follows a re-plan: entries on the new route move atoms by their run-wide id', () => {
    const s1 = deriveRunState(routes(first), 10, 10, [entry(1, 0, 'placed'), entry(2, 1, 'lost')])
    const r = replanFromState(s1, first)
    // The re-plan sends the spare (run-wide atom 2, index 1 in the new route) to site 1.
    const second: RouteSnap = { id: 11, parent_id: 10, atoms: r.atoms, atom_ids: r.atom_ids, sites: r.sites, placed: r.placed, base_seq: 2, anchor: false, moves: [{ atom: 1, site: 1, path: [[5, 5], [1, 5], [1, 2]], length_nm: 7 }] }
    const s2 = deriveRunState(routes(first, second), 10, 11, [entry(1, 0, 'placed'), entry(2, 1, 'lost'), { ...entry(3, 0, 'placed'), route_id: 11 }])
    expect(s2.chain).toEqual([10, 11])
    expect(s2.current_move).toBeNull()
    expect(pos(s2, 2)).toEqual([1, 2])
    expect(s2.placed).toEqual([[0, 0], [1, 2]])
    expect(s2.needs_replan).toBeNull()
  })

  it('restarts positions at a re-plan from a newer scan (an anchor)', () => {
    const fromScan: RouteSnap = { id: 12, parent_id: 10, atoms: [[1, 0.02], [3, 3]], atom_ids: [0, 1], sites: [[1, 0], [1, 2]], placed: [[0, 0]], base_seq: 1, anchor: true, moves: [{ atom: 1, site: 1, path: [[3, 3], [1, 2]], length_nm: 2.2 }] }
    const s = deriveRunState(routes(first, fromScan), 10, 12, [entry(1, 0, 'lost')])
    // The scan says atom 0 sits at (1, 0.02) on site 0: the earlier 'lost' no longer applies.
    expect(s.atoms).toEqual([{ atom: 0, position: [1, 0.02] }, { atom: 1, position: [3, 3] }])
    expect(s.placed).toEqual([[0, 0]])
    expect(s.current_move).toBe(0)
  })
})
