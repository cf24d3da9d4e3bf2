// Shapes of lab-level rows as the API returns them (dates arrive as ISO strings).
import type { Role } from '../roles'

export interface SampleRow {
  id: number
  name: string
  surface: string
  adsorbate: string
  temperature_K: number
  notes: string
  builds: number
  scans: number
  created_by: string
  updated_at: string
  archived_at: string | null
}

export interface MemberRow { user_id: number, name: string, email: string, role: Role, joined_at: string }
export interface InviteRow { id: number, email: string, role: Role, expires_at: string, created_at: string }
