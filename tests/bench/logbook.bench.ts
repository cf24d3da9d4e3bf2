// Logbook derivation: every append and every GET of a run replays the whole logbook over the
// atoms' starting positions (shared/logbook/state.ts). Figures for nights of 1 000 and 10 000
// entries on a 1 000-move route, and for the lab's rate tally over 100 000 attempts.
import { deriveRunState, tallyRates, type Attempt, type EntrySnap, type Outcome, type RouteSnap } from '../../shared/logbook'
import { mulberry32 } from '../../shared/scan/synthetic'
import { bench, section } from './harness'

function night(moves: number, entries: number) {
  const rnd = mulberry32(11)
  const route: RouteSnap = {
    id: 1, parent_id: null, base_seq: 0, anchor: false, placed: [],
    atoms: Array.from({ length: moves }, (_, k) => [k, 0]), atom_ids: Array.from({ length: moves }, (_, k) => k),
    sites: Array.from({ length: moves }, (_, k) => [k, 5]),
    moves: Array.from({ length: moves }, (_, k) => ({ atom: k, site: k, path: [[k, 0], [k, 5]], length_nm: 5 })),
  }
  const list: EntrySnap[] = []
  let move = 0
  for (let seq = 1; seq <= entries; seq++) {
    const outcome: Outcome = rnd() < 0.7 ? 'placed' : 'stayed'
    list.push({ id: seq, seq, route_id: 1, move_index: move % moves, outcome, position: null, supersedes: null })
    if (outcome === 'placed') move++
  }
  return { routes: new Map([[1, route]]), list }
}

export async function run() {
  section('logbook')
  for (const n of [1000, 10000]) {
    const { routes, list } = night(1000, n)
    await bench(`deriveRunState, ${n} entries, 1 000 moves`, () => deriveRunState(routes, 1, 1, list))
  }
  const rnd = mulberry32(5)
  const attempts: Attempt[] = Array.from({ length: 100_000 }, () => ({ outcome: rnd() < 0.6 ? 'placed' : 'stayed', length_nm: rnd() * 15, angle_deg: rnd() * 60, symmetry_deg: 60, bias_V: -0.005, setpoint_A: 5e-8 }))
  await bench('tallyRates, 100 000 attempts', () => tallyRates(attempts))
}
