// Tessera's tables for the whole job: accounts and labs, samples and scans, the plan (marks,
// lattice fits, blueprints, routes), the night (build runs, logbook) and the morning after
// (as-built checks). Rows that record work are never rewritten: edits add versions, the logbook
// only appends, and every change a user makes leaves a line in the audit log.
import { sql } from 'drizzle-orm'
import { index, integer, real, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core'

const id = () => integer('id').primaryKey({ autoIncrement: true })
const createdAt = () => integer('created_at', { mode: 'timestamp_ms' }).notNull().$defaultFn(() => new Date())

export const ROLES = ['owner', 'member', 'viewer'] as const
export const OUTCOMES = ['placed', 'stayed', 'off-site', 'lost', 'tip-change', 'skipped'] as const

export const users = sqliteTable('users', {
  id: id(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  password_hash: text('password_hash').notNull(),
  created_at: createdAt(),
}, t => [uniqueIndex('users_email_unique').on(t.email)])

export const labs = sqliteTable('labs', {
  id: id(),
  name: text('name').notNull(),
  // Per-lab instrument settings used by the route's time estimate (tip speed, overheads).
  settings: text('settings', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  created_at: createdAt(),
})

export const memberships = sqliteTable('memberships', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  user_id: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: text('role', { enum: ROLES }).notNull(),
  created_at: createdAt(),
}, t => [uniqueIndex('memberships_lab_user').on(t.lab_id, t.user_id), index('memberships_user').on(t.user_id)])

export const invites = sqliteTable('invites', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  email: text('email').notNull(),
  role: text('role', { enum: ROLES }).notNull(),
  // Only a SHA-256 of the token is stored; the token itself travels in the e-mail link.
  token_hash: text('token_hash').notNull(),
  invited_by: integer('invited_by').notNull().references(() => users.id),
  expires_at: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  accepted_at: integer('accepted_at', { mode: 'timestamp_ms' }),
  accepted_by: integer('accepted_by').references(() => users.id),
  revoked_at: integer('revoked_at', { mode: 'timestamp_ms' }),
  created_at: createdAt(),
}, t => [uniqueIndex('invites_token').on(t.token_hash), index('invites_lab').on(t.lab_id)])

export const passwordResets = sqliteTable('password_resets', {
  id: id(),
  user_id: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  token_hash: text('token_hash').notNull(),
  expires_at: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  used_at: integer('used_at', { mode: 'timestamp_ms' }),
  created_at: createdAt(),
}, t => [uniqueIndex('password_resets_token').on(t.token_hash)])

// Failed sign-in attempts, kept in the database so that several app servers share one limit.
export const loginAttempts = sqliteTable('login_attempts', {
  id: id(),
  key: text('key').notNull(),
  created_at: createdAt(),
}, t => [index('login_attempts_key').on(t.key, t.created_at)])

export const samples = sqliteTable('samples', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  surface: text('surface').notNull(),
  adsorbate: text('adsorbate').notNull(),
  temperature_K: real('temperature_K').notNull(),
  notes: text('notes').notNull().default(''),
  // Surface-state parameters for the wave preview, editable per sample.
  surface_state: text('surface_state', { mode: 'json' }).$type<{ E0_eV: number, m_eff: number, source?: string }>(),
  archived_at: integer('archived_at', { mode: 'timestamp_ms' }),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
  updated_at: integer('updated_at', { mode: 'timestamp_ms' }).notNull().$defaultFn(() => new Date()),
}, t => [index('samples_lab').on(t.lab_id)])

// One build of one structure on one sample: the workspace page ties its scans, blueprint,
// routes, runs and checks together.
export const builds = sqliteTable('builds', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  sample_id: integer('sample_id').notNull().references(() => samples.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  notes: text('notes').notNull().default(''),
  archived_at: integer('archived_at', { mode: 'timestamp_ms' }),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [index('builds_sample').on(t.sample_id), index('builds_lab').on(t.lab_id)])

export const scans = sqliteTable('scans', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  sample_id: integer('sample_id').notNull().references(() => samples.id, { onDelete: 'cascade' }),
  build_id: integer('build_id').references(() => builds.id),
  // 'plan' scans are what a route starts from; 'after' scans feed the as-built check.
  purpose: text('purpose', { enum: ['plan', 'after'] }).notNull().default('plan'),
  filename: text('filename').notNull(),
  format: text('format').notNull(),
  storage_key: text('storage_key').notNull(),
  grid_key: text('grid_key'),
  bytes: integer('bytes').notNull(),
  width_px: integer('width_px').notNull(),
  height_px: integer('height_px').notNull(),
  size_x_nm: real('size_x_nm').notNull(),
  size_y_nm: real('size_y_nm').notNull(),
  offset_x_nm: real('offset_x_nm').notNull().default(0),
  offset_y_nm: real('offset_y_nm').notNull().default(0),
  rotation_deg: real('rotation_deg').notNull().default(0),
  bias_V: real('bias_V'),
  setpoint_A: real('setpoint_A'),
  z_scale: text('z_scale', { mode: 'json' }).$type<Record<string, number>>(),
  // Non-destructive processing steps (leveling, contrast, colour map), saved with the scan.
  processing: text('processing', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  taken_at: integer('taken_at', { mode: 'timestamp_ms' }),
  notes: text('notes').notNull().default(''),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [index('scans_sample').on(t.sample_id), index('scans_build').on(t.build_id)])

// Marks are saved as whole versions of a scan's mark set: an edit adds a version, so an earlier
// set can always be recovered.
export const markSets = sqliteTable('mark_sets', {
  id: id(),
  scan_id: integer('scan_id').notNull().references(() => scans.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  source: text('source', { enum: ['detect', 'edit', 'import'] }).notNull(),
  params: text('params', { mode: 'json' }).$type<Record<string, unknown>>(),
  marks: text('marks', { mode: 'json' }).$type<{ x_nm: number, y_nm: number, height_nm: number, score: number, species?: string }[]>().notNull(),
  count: integer('count').notNull(),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [uniqueIndex('mark_sets_scan_version').on(t.scan_id, t.version)])

export const latticeFits = sqliteTable('lattice_fits', {
  id: id(),
  scan_id: integer('scan_id').notNull().references(() => scans.id, { onDelete: 'cascade' }),
  version: integer('version').notNull(),
  surface: text('surface').notNull(),
  site: text('site').notNull(),
  source: text('source', { enum: ['fit', 'hand'] }).notNull(),
  locked: integer('locked', { mode: 'boolean' }).notNull().default(false),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  residual_nm: real('residual_nm'),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [uniqueIndex('lattice_fits_scan_version').on(t.scan_id, t.version)])

// Every save of a blueprint is a new row; rows sharing a lineage are the versions of one
// blueprint.
export const blueprints = sqliteTable('blueprints', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  sample_id: integer('sample_id').notNull().references(() => samples.id, { onDelete: 'cascade' }),
  build_id: integer('build_id').references(() => builds.id),
  // The scan whose lattice fit the shapes were drawn through: later scans are registered to it.
  scan_id: integer('scan_id').references(() => scans.id),
  lineage: integer('lineage').notNull(),
  version: integer('version').notNull(),
  name: text('name').notNull(),
  surface: text('surface').notNull(),
  site: text('site').notNull(),
  min_spacing_nm: real('min_spacing_nm'),
  shapes: text('shapes', { mode: 'json' }).$type<unknown[]>().notNull(),
  site_count: integer('site_count').notNull().default(0),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [uniqueIndex('blueprints_lineage_version').on(t.lineage, t.version), index('blueprints_sample').on(t.sample_id)])

export const routes = sqliteTable('routes', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  blueprint_id: integer('blueprint_id').notNull().references(() => blueprints.id),
  scan_id: integer('scan_id').references(() => scans.id),
  // A re-plan points back at the route it replaces.
  parent_id: integer('parent_id'),
  options: text('options', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  move_count: integer('move_count').notNull(),
  total_length_nm: real('total_length_nm').notNull(),
  solver_ms: real('solver_ms').notNull(),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [index('routes_blueprint').on(t.blueprint_id)])

export const buildRuns = sqliteTable('build_runs', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  build_id: integer('build_id').references(() => builds.id),
  route_id: integer('route_id').notNull().references(() => routes.id),
  // The route currently being followed; changes on every re-plan (the history is in routes).
  current_route_id: integer('current_route_id').notNull().references(() => routes.id),
  state: text('state', { enum: ['open', 'closed'] }).notNull().default('open'),
  params: text('params', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  notes: text('notes').notNull().default(''),
  started_by: integer('started_by').notNull().references(() => users.id),
  started_at: createdAt(),
  closed_at: integer('closed_at', { mode: 'timestamp_ms' }),
  closed_by: integer('closed_by').references(() => users.id),
}, t => [index('build_runs_lab').on(t.lab_id)])

// Append-only: a correction is a new entry that names the one it supersedes.
export const logbookEntries = sqliteTable('logbook_entries', {
  id: id(),
  run_id: integer('run_id').notNull().references(() => buildRuns.id, { onDelete: 'cascade' }),
  seq: integer('seq').notNull(),
  route_id: integer('route_id').notNull().references(() => routes.id),
  move_index: integer('move_index').notNull(),
  outcome: text('outcome', { enum: OUTCOMES }).notNull(),
  params: text('params', { mode: 'json' }).$type<Record<string, unknown>>().notNull().default(sql`'{}'`),
  position: text('position', { mode: 'json' }).$type<[number, number]>(),
  note: text('note').notNull().default(''),
  supersedes: integer('supersedes'),
  idempotency_key: text('idempotency_key').notNull(),
  author_id: integer('author_id').notNull().references(() => users.id),
  created_at: createdAt(),
}, t => [
  uniqueIndex('logbook_run_seq').on(t.run_id, t.seq),
  uniqueIndex('logbook_idempotency').on(t.run_id, t.idempotency_key),
])

export const asBuiltChecks = sqliteTable('as_built_checks', {
  id: id(),
  lab_id: integer('lab_id').notNull().references(() => labs.id, { onDelete: 'cascade' }),
  blueprint_id: integer('blueprint_id').notNull().references(() => blueprints.id),
  scan_id: integer('scan_id').notNull().references(() => scans.id),
  run_id: integer('run_id').references(() => buildRuns.id),
  tolerance_nm: real('tolerance_nm').notNull(),
  result: text('result', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  fidelity: real('fidelity').notNull(),
  rms_nm: real('rms_nm'),
  created_by: integer('created_by').notNull().references(() => users.id),
  created_at: createdAt(),
})

export const auditLog = sqliteTable('audit_log', {
  id: id(),
  lab_id: integer('lab_id').references(() => labs.id, { onDelete: 'cascade' }),
  user_id: integer('user_id').references(() => users.id),
  action: text('action').notNull(),
  target: text('target').notNull().default(''),
  detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
  created_at: createdAt(),
}, t => [index('audit_lab').on(t.lab_id, t.created_at)])
