// Drizzle schema: every table Cellwright stores. camelCase keys map to snake_case columns.
import { sqliteTable, integer, text, real, blob, uniqueIndex, index, primaryKey, type AnySQLiteColumn } from 'drizzle-orm/sqlite-core';
import { sql } from 'drizzle-orm';
import type { ProjectSettings, TestConditions } from '../../shared/schemas/project';
import type { ColumnMapping, FileConditions, CurveMetrics, MetricMethod } from '../../shared/curves/types';

const createdAt = () => text('created_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`);

export const labs = sqliteTable('labs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull().unique(),
  kind: text('kind', { enum: ['home', 'partner'] }).notNull(),
  city: text('city'),
  createdAt: createdAt(),
});

export const users = sqliteTable('users', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  email: text('email').notNull().unique(),
  name: text('name').notNull(),
  passwordHash: text('password_hash'),
  isAdmin: integer('is_admin', { mode: 'boolean' }).notNull().default(false),
  labId: integer('lab_id').references(() => labs.id),
  disabledAt: text('disabled_at'),
  createdAt: createdAt(),
});

export const sessions = sqliteTable('sessions', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  tokenHash: text('token_hash').notNull().unique(),
  csrfToken: text('csrf_token').notNull(),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  userAgent: text('user_agent'),
  createdAt: createdAt(),
  lastSeenAt: text('last_seen_at'),
  expiresAt: text('expires_at').notNull(),
  revokedAt: text('revoked_at'),
}, (t) => [index('sessions_user_idx').on(t.userId)]);

export const apiTokens = sqliteTable('api_tokens', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  tokenHash: text('token_hash').notNull().unique(),
  /** read: GET only; upload: reads and curve uploads; full: all the person may do (never minting tokens or ending sessions) */
  scope: text('scope', { enum: ['read', 'upload', 'full'] }).notNull().default('full'),
  /** the token this one was made with, if any: revoking a token revokes the tokens made with it */
  parentTokenId: integer('parent_token_id').references((): AnySQLiteColumn => apiTokens.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  lastUsedAt: text('last_used_at'),
  revokedAt: text('revoked_at'),
});

export const projects = sqliteTable('projects', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  name: text('name').notNull(),
  description: text('description').notNull().default(''),
  codePrefix: text('code_prefix').notNull().default('B'),
  settings: text('settings', { mode: 'json' }).$type<ProjectSettings>().notNull(),
  /** bumped whenever the reference point changes; curve metrics carry the version they were computed for */
  metricsVersion: integer('metrics_version').notNull().default(1),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
  updatedAt: text('updated_at'),
});

export const memberships = sqliteTable('memberships', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: text('role', { enum: ['pi', 'researcher', 'partner', 'viewer'] }).notNull(),
  notify: integer('notify', { mode: 'boolean' }).notNull().default(true),
  /** collect this project's notices into one daily e-mail instead of one e-mail each */
  digest: integer('digest', { mode: 'boolean' }).notNull().default(false),
  createdAt: createdAt(),
}, (t) => [uniqueIndex('memberships_project_user').on(t.projectId, t.userId)]);

/** Notices waiting for a person's daily digest; sentAt is set when the digest goes out. */
export const pendingNotices = sqliteTable('pending_notices', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  createdAt: createdAt(),
  sentAt: text('sent_at'),
}, (t) => [index('pending_notices_user_idx').on(t.userId, t.sentAt)]);

export const factors = sqliteTable('factors', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  key: text('key').notNull(),
  label: text('label').notNull(),
  unit: text('unit').notNull().default(''),
  kind: text('kind', { enum: ['continuous', 'categorical'] }).notNull(),
  low: real('low'),
  high: real('high'),
  levels: text('levels', { mode: 'json' }).$type<string[]>(),
  /** a condition of the test (cell temperature, pressure, gas, stoichiometry), not of the electrode */
  testVariable: integer('test_variable', { mode: 'boolean' }).notNull().default(false),
  position: integer('position').notNull().default(0),
  createdAt: createdAt(),
}, (t) => [uniqueIndex('factors_project_key').on(t.projectId, t.key)]);

export const responseDefs = sqliteTable('responses', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  key: text('key').notNull(),
  label: text('label').notNull(),
  unit: text('unit').notNull().default(''),
  goal: text('goal', { enum: ['maximize', 'minimize', 'target'] }).notNull(),
  target: real('target'),
  createdAt: createdAt(),
}, (t) => [uniqueIndex('responses_project_key').on(t.projectId, t.key)]);

/** A programme goal on a curve metric or hand-entered response: ≥ or ≤ a value in a unit. */
export const targets = sqliteTable('targets', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  /** a curve metric key (vAtRef, massActivity …) or a hand-entered response key */
  metric: text('metric').notNull(),
  comparator: text('comparator', { enum: ['>=', '<='] }).notNull(),
  value: real('value').notNull(),
  unit: text('unit').notNull(),
  basis: text('basis', { enum: ['catalyst', 'metal'] }),
  /** the conditions the target is stated at, as the programme writes them */
  conditions: text('conditions').notNull().default(''),
  dueDate: text('due_date'),
  name: text('name').notNull().default(''),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
  updatedAt: text('updated_at'),
}, (t) => [index('targets_project_idx').on(t.projectId)]);

// A design whose runs were turned into planned builds: what was asked for and what came out,
// so every build made from it can point back to it.
export const designs = sqliteTable('designs', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  kind: text('kind').notNull(),
  seed: integer('seed'),
  /** the design request and summary (variant, α, blocks, factors, held values) */
  settings: text('settings', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  runCount: integer('run_count').notNull(),
  note: text('note').notNull().default(''),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
}, (t) => [index('designs_project_idx').on(t.projectId)]);

/** A catalyst batch of a project: who made it, how much, when, its metal content. */
export const lots = sqliteTable('lots', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  /** the lab or supplier that made it */
  maker: text('maker').notNull().default(''),
  batchSizeG: real('batch_size_g'),
  /** synthesis or receipt date, YYYY-MM-DD */
  madeOn: text('made_on'),
  metalWtPct: real('metal_wt_pct'),
  notes: text('notes').notNull().default(''),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
  updatedAt: text('updated_at'),
}, (t) => [uniqueIndex('lots_project_name').on(t.projectId, t.name)]);

export const builds = sqliteTable('builds', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  code: text('code').notNull(),
  parentId: integer('parent_id'),
  changeNote: text('change_note'),
  factorValues: text('factor_values', { mode: 'json' }).$type<Record<string, number | string>>().notNull(),
  loadingMgCm2: real('loading_mg_cm2'),
  metalLoadingMgCm2: real('metal_loading_mg_cm2'),
  areaCm2: real('area_cm2'),
  catalystLot: text('catalyst_lot'),
  /** the lot record the build was made from (catalystLot keeps the name as first typed) */
  lotId: integer('lot_id').references((): AnySQLiteColumn => lots.id, { onDelete: 'set null' }),
  labId: integer('lab_id').references(() => labs.id),
  operatorId: integer('operator_id').references(() => users.id),
  testConditions: text('test_conditions', { mode: 'json' }).$type<TestConditions>().notNull(),
  status: text('status', { enum: ['planned', 'built', 'tested', 'reviewed', 'discarded'] }).notNull().default('planned'),
  builtOn: text('built_on'),
  testedOn: text('tested_on'),
  replicateOf: integer('replicate_of'),
  responseValues: text('response_values', { mode: 'json' }).$type<Record<string, number>>().notNull(),
  notes: text('notes').notNull().default(''),
  /** the design this build was planned from, if any */
  designId: integer('design_id').references(() => designs.id, { onDelete: 'set null' }),
  /** the date the build was planned (YYYY-MM-DD) */
  plannedOn: text('planned_on'),
  /** why a flagged proposal was planned anyway (outside the data's support, at a physical limit) */
  planReason: text('plan_reason'),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
  updatedAt: text('updated_at'),
}, (t) => [
  uniqueIndex('builds_project_code').on(t.projectId, t.code),
  // the builds list reads a project's builds in id order: no sort of the whole project per request
  index('builds_project_id_idx').on(t.projectId, t.id),
  index('builds_parent_idx').on(t.parentId),
]);

export const files = sqliteTable('files', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  sha256: text('sha256').notNull(),
  sizeBytes: integer('size_bytes').notNull(),
  originalName: text('original_name').notNull(),
  contentType: text('content_type').notNull(),
  projectId: integer('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  buildId: integer('build_id').references(() => builds.id, { onDelete: 'set null' }),
  /** a lot's certificate or analysis (metal content, particle size…), when the file belongs to a lot */
  lotId: integer('lot_id').references(() => lots.id, { onDelete: 'set null' }),
  uploadedBy: integer('uploaded_by').references(() => users.id),
  uploadedAt: createdAt(),
}, (t) => [index('files_sha_idx').on(t.sha256)]);

export const curves = sqliteTable('curves', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  buildId: integer('build_id').notNull().references(() => builds.id, { onDelete: 'cascade' }),
  fileId: integer('file_id').references(() => files.id),
  kind: text('kind', { enum: ['polarization', 'durability', 'hold', 'impedance'] }).notNull(),
  label: text('label').notNull().default(''),
  mapping: text('mapping', { mode: 'json' }).$type<ColumnMapping>(),
  conditions: text('conditions', { mode: 'json' }).$type<FileConditions>(),
  pointCount: integer('point_count').notNull(),
  /** packed Float64 columns: see server/curves/points-codec.ts */
  points: blob('points', { mode: 'buffer' }).notNull(),
  metrics: text('metrics', { mode: 'json' }).$type<CurveMetrics>().notNull(),
  metricNotes: text('metric_notes', { mode: 'json' }).$type<Record<string, string>>().notNull(),
  method: text('method', { mode: 'json' }).$type<Record<string, MetricMethod>>().notNull(),
  summary: text('summary', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
  metricsVersion: integer('metrics_version').notNull(),
  options: text('options', { mode: 'json' }).$type<Record<string, unknown>>(),
  /** the one curve of its kind that stands for the build in every table, chart and fit */
  isRecord: integer('is_record', { mode: 'boolean' }).notNull().default(false),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
}, (t) => [
  index('curves_build_idx').on(t.buildId),
  // at most one curve of record per build and kind
  uniqueIndex('curves_record_idx').on(t.buildId, t.kind).where(sql`${t.isRecord} = 1`),
]);

/**
 * The points of a long curve (a log of a million rows), in pieces of about 1 MB: `curves.points`
 * then holds only their layout (see server/curves/points-codec.ts). Written and read a piece at a
 * time, a 32 MB log never sits in memory twice, and SQLite writes small rows faster than one
 * chain of overflow pages.
 */
export const curvePointChunks = sqliteTable('curve_point_chunks', {
  curveId: integer('curve_id').notNull().references(() => curves.id, { onDelete: 'cascade' }),
  seq: integer('seq').notNull(),
  bytes: blob('bytes', { mode: 'buffer' }).notNull(),
}, (t) => [primaryKey({ columns: [t.curveId, t.seq] })]);

/**
 * A published or otherwise outside polarization curve that belongs to no build, with its
 * provenance: where it comes from, when, and the conditions it was measured at. Its metrics are
 * read on demand at the project's current reference point.
 */
export const referenceCurves = sqliteTable('reference_curves', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  fileId: integer('file_id').references(() => files.id),
  label: text('label').notNull(),
  /** where the curve comes from: a paper, a report, a partner's standard MEA */
  source: text('source').notNull(),
  /** the date of the source (YYYY-MM-DD) */
  sourceDate: text('source_date'),
  conditions: text('conditions', { mode: 'json' }).$type<TestConditions>().notNull(),
  loadingMgCm2: real('loading_mg_cm2'),
  metalLoadingMgCm2: real('metal_loading_mg_cm2'),
  areaCm2: real('area_cm2'),
  notes: text('notes').notNull().default(''),
  mapping: text('mapping', { mode: 'json' }).$type<ColumnMapping>(),
  pointCount: integer('point_count').notNull(),
  /** packed Float64 columns: see server/curves/points-codec.ts */
  points: blob('points', { mode: 'buffer' }).notNull(),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
}, (t) => [index('reference_curves_project_idx').on(t.projectId)]);

/** The project's benchmark: one of its builds, or one of its reference curves. */
export const benchmarks = sqliteTable('benchmarks', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  projectId: integer('project_id').notNull().unique().references(() => projects.id, { onDelete: 'cascade' }),
  buildId: integer('build_id').references(() => builds.id, { onDelete: 'cascade' }),
  referenceCurveId: integer('reference_curve_id').references(() => referenceCurves.id, { onDelete: 'cascade' }),
  /** why this is the benchmark ("the group's standard MEA") */
  note: text('note').notNull().default(''),
  setBy: integer('set_by').references(() => users.id),
  setAt: text('set_at').notNull().default(sql`(strftime('%Y-%m-%dT%H:%M:%fZ','now'))`),
});

export const importProfiles = sqliteTable('import_profiles', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  labId: integer('lab_id').references(() => labs.id),
  projectId: integer('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  name: text('name').notNull(),
  /** mapping by header text, so it survives column reordering */
  mapping: text('mapping', { mode: 'json' }).$type<Record<string, { header: string; unit: string; negated?: boolean }>>().notNull(),
  kind: text('kind', { enum: ['polarization', 'durability', 'hold', 'impedance'] }).notNull().default('polarization'),
  createdBy: integer('created_by').references(() => users.id),
  createdAt: createdAt(),
});

export const invitations = sqliteTable('invitations', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  tokenHash: text('token_hash').notNull().unique(),
  email: text('email').notNull(),
  projectId: integer('project_id').notNull().references(() => projects.id, { onDelete: 'cascade' }),
  role: text('role', { enum: ['pi', 'researcher', 'partner', 'viewer'] }).notNull(),
  labId: integer('lab_id').references(() => labs.id),
  invitedBy: integer('invited_by').references(() => users.id),
  createdAt: createdAt(),
  expiresAt: text('expires_at').notNull(),
  acceptedAt: text('accepted_at'),
});

export const outbox = sqliteTable('outbox', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  to: text('to').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  html: text('html'),
  transport: text('transport').notNull(),
  messageId: text('message_id'),
  createdAt: createdAt(),
});

export const reviews = sqliteTable('reviews', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  buildId: integer('build_id').notNull().references(() => builds.id, { onDelete: 'cascade' }),
  userId: integer('user_id').notNull().references(() => users.id),
  body: text('body').notNull(),
  verdict: text('verdict', { enum: ['approved', 'needs-work'] }),
  createdAt: createdAt(),
}, (t) => [index('reviews_build_idx').on(t.buildId)]);

export const auditLog = sqliteTable('audit_log', {
  id: integer('id').primaryKey({ autoIncrement: true }),
  userId: integer('user_id'),
  at: createdAt(),
  action: text('action').notNull(),
  entity: text('entity').notNull(),
  entityId: integer('entity_id'),
  projectId: integer('project_id'),
  before: text('before', { mode: 'json' }),
  after: text('after', { mode: 'json' }),
}, (t) => [index('audit_entity_idx').on(t.entity, t.entityId), index('audit_project_idx').on(t.projectId)]);
