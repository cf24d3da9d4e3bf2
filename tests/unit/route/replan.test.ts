// Re-plan keeps atoms already placed (locked on their sites) and solves the rest from the atoms'
// current positions; checked by the independent replay checker.
import { describe, expect, it } from 'vitest'
import { replan, solveRoute } from '../../../shared/route/index'
import { replayRoute } from './replay-checker'
import { ring, rng, scatter, type P } from './gen'

describe('replan', () => {
  it('keeps placed atoms on their sites and never moves them', () => {
    const R = rng(21)
    const sites = ring(24, 4)
    const atoms = scatter(R, 60, [-9, 9, -9, 9], 0.6)
    const first = solveRoute({ atoms, sites })
    // Execute the first half of the moves; the atoms moved there are "placed" (one landed 0.08 nm
    // off its site, beyond the 0.05 nm snap, and must still count as placed).
    const now: P[] = atoms.map(p => [p[0], p[1]])
    const placed: Array<[number, number]> = []
    first.moves.slice(0, 12).forEach((m, i) => {
      const end = m.path[m.path.length - 1]!
      now[m.atom] = i === 0 ? [end[0] + 0.08, end[1]] : [end[0], end[1]]
      if (m.kind !== 'parking') placed.push([m.site, m.atom])
    })
    const again = replan({ atoms: now, sites, placed })
    for (const [s, a] of placed) expect(again.assignment).toContainEqual([a, s])
    const movedAtoms = new Set(again.moves.map(m => m.atom))
    for (const [, a] of placed) expect(movedAtoms.has(a)).toBe(false)
    expect(again.unfilled_sites).toEqual([])
    const rep = replayRoute({ atoms: now, sites, locked: placed.map(p => p[1]) }, again)
    expect(rep.unreported).toEqual([])
    expect(rep.lockedMoved).toEqual([])
    // Only the other sites need checking for position: the off-by-0.08 atom is placed by fiat.
    expect(rep.unfilled.filter(s => !placed.some(p => p[0] === s))).toEqual([])
  })
  it('accepts placed as an object keyed by site index', () => {
    const sites: P[] = [[0, 0], [3, 0]]
    const atoms: P[] = [[0.02, 0], [5, 5]]
    const r = replan({ atoms, sites, placed: { 0: 0 } })
    expect(r.assignment).toEqual([[0, 0], [1, 1]])
    expect(r.moves.map(m => m.atom)).toEqual([1])
  })
})
