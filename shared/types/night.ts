// Shapes of the night's API answers as the client reads them (dates arrive as ISO strings).
import type { Outcome, Point, RunState } from '../logbook/types'
import type { Forecast } from '../logbook/rates'

export interface RunMove { atom: number, atom_id: number, site: number, path: Point[], length_nm: number, kind: string, estimate_s: number | null }

export interface RunEntry {
  id: number
  seq: number
  route_id: number
  move_index: number
  outcome: Outcome
  params: { bias_V?: number, setpoint_A?: number, tip_speed_nm_s?: number }
  position: Point | null
  note: string
  supersedes: number | null
  superseded_by: number | null
  author: string
  author_id: number
  created_at: string
}

export interface RunFrame { scan_id: number, filename: string, size_x_nm: number, size_y_nm: number, offset_x_nm: number, offset_y_nm: number, rotation_deg: number }

export interface RunView {
  role: 'owner' | 'member' | 'viewer'
  run: {
    id: number
    lab_id: number
    build_id: number | null
    route_id: number
    current_route_id: number
    state: 'open' | 'closed'
    params: { bias_V?: number, setpoint_A?: number, tip_speed_nm_s?: number }
    notes: string
    started_at: string
    started_by_name: string
    closed_at: string | null
    closed_by_name: string | null
  }
  build: { id: number, name: string } | null
  sample: { id: number, name: string, surface: string, adsorbate: string, temperature_K: number } | null
  blueprint: { id: number, name: string, version: number, site_count: number } | null
  frame: RunFrame | null
  route: {
    id: number
    parent_id: number | null
    created_at: string
    moves: RunMove[]
    sites: Point[]
    atoms: Point[]
    atom_ids: number[]
    lattice: { a1: Point, a2: Point, origin: Point } | null
    unfilled_sites: number[]
    warnings: { message: string }[]
    total_length_nm: number
    time_s: number | null
  }
  entries: RunEntry[]
  state: RunState
  history: { id: number, parent_id: number | null, created_at: string, source: 'plan' | 'replan' | 'scan', reason: string | null, base_seq: number, scan_id: number | null, move_count: number, total_length_nm: number, created_by: string }[]
  checks: { id: number, scan_id: number, blueprint_id: number, fidelity: number, rms_nm: number | null, tolerance_nm: number, created_at: string }[]
  forecast: Forecast
  rates: { attempts: number, placed: number, rate: number | null, enough: boolean, min_attempts: number }
}

export interface RunListRow {
  id: number
  build_id: number | null
  build_name: string | null
  route_id: number
  current_route_id: number
  state: 'open' | 'closed'
  started_at: string
  closed_at: string | null
  started_by: string
  moves_total: number
  entries: number
  placed: number
  fidelity: number | null
}

export interface CheckResult {
  placed: number[]
  missing: number[]
  extra: number[]
  rms_nm: number | null
  fidelity: number
  pairs: [number, number, number][]
  off_site: { site: number, found: number, offset: Point, distance_nm: number }[]
  site_status: ('placed' | 'off-site' | 'missing')[]
  mean_offset_nm: Point | null
  tolerance_nm: number
  near_nm: number
  warnings: string[]
  sites: Point[]
  found: Point[]
}

export interface CheckRow {
  id: number
  lab_id: number
  blueprint_id: number
  scan_id: number
  run_id: number | null
  tolerance_nm: number
  fidelity: number
  rms_nm: number | null
  result: CheckResult
  created_at: string
}

export interface CheckListRow {
  id: number
  blueprint_id: number
  blueprint_name: string
  blueprint_version: number
  scan_id: number
  scan_filename: string
  run_id: number | null
  tolerance_nm: number
  fidelity: number
  rms_nm: number | null
  site_count: number
  created_at: string
  created_by: string
}

export const OUTCOME_LABELS: Record<Outcome, string> = {
  'placed': 'Placed',
  'stayed': 'Stayed',
  'off-site': 'Off-site',
  'lost': 'Lost',
  'tip-change': 'Tip change',
  'skipped': 'Skipped',
}
