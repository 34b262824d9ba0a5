import { sql } from 'drizzle-orm'
import {
  boolean, double, index, int, json, mysqlEnum, mysqlTable, text, timestamp, uniqueIndex, varchar,
} from 'drizzle-orm/mysql-core'

// One schema for the whole product. Table and column names are snake_case plurals (STYLE §4);
// every row that belongs to a shop carries shop_id so each query can be scoped to one shop.

export const ROLES = ['owner', 'trainer', 'operator', 'trainee'] as const
export const SPINDLE_KINDS = ['trim-router', 'air-spindle', 'water-spindle'] as const

const createdAt = () => timestamp('created_at', { fsp: 3 }).notNull().defaultNow()
const updatedAt = () => timestamp('updated_at', { fsp: 3 }).notNull().defaultNow().onUpdateNow()

export const shops = mysqlTable('shops', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  units: mysqlEnum('units', ['mm', 'in']).notNull().default('mm'),
  createdAt: createdAt(),
})

export const users = mysqlTable('users', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  email: varchar('email', { length: 254 }).notNull(),
  name: varchar('name', { length: 120 }).notNull(),
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  // A short PIN lets a trainer sign a trainee's run on the same tablet without a full sign-in.
  pinHash: varchar('pin_hash', { length: 255 }),
  role: mysqlEnum('role', ROLES).notNull(),
  units: mysqlEnum('units', ['mm', 'in']),
  active: boolean('active').notNull().default(true),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [
  uniqueIndex('users_email_unique').on(t.email),
  index('users_shop_idx').on(t.shopId),
])

export const machines = mysqlTable('machines', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  name: varchar('name', { length: 80 }).notNull(),
  // Travel of the work area in millimetres; the preferred display units are separate.
  travelXMm: double('travel_x_mm').notNull(),
  travelYMm: double('travel_y_mm').notNull(),
  travelZMm: double('travel_z_mm').notNull(),
  units: mysqlEnum('units', ['mm', 'in']).notNull().default('mm'),
  spindleKind: mysqlEnum('spindle_kind', SPINDLE_KINDS).notNull(),
  hasLengthSensor: boolean('has_length_sensor').notNull().default(false),
  spoilboardMaterial: varchar('spoilboard_material', { length: 60 }).notNull().default('MDF'),
  spoilboardNominalMm: double('spoilboard_nominal_mm').notNull(),
  spoilboardMinMm: double('spoilboard_min_mm').notNull(),
  accelMmS2: double('accel_mm_s2').notNull().default(500),
  rapidMmMin: double('rapid_mm_min').notNull().default(5000),
  notes: text('notes'),
  retiredAt: timestamp('retired_at', { fsp: 3 }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [index('machines_shop_idx').on(t.shopId)])

export const procedures = mysqlTable('procedures', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  slug: varchar('slug', { length: 80 }).notNull(),
  category: varchar('category', { length: 40 }).notNull(),
  currentVersionId: int('current_version_id'),
  retiredAt: timestamp('retired_at', { fsp: 3 }),
  createdAt: createdAt(),
}, t => [uniqueIndex('procedures_shop_slug_unique').on(t.shopId, t.slug)])

// A published version never changes; editing a procedure writes a new version.
export const procedureVersions = mysqlTable('procedure_versions', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  procedureId: int('procedure_id').notNull().references(() => procedures.id),
  version: int('version').notNull(),
  title: varchar('title', { length: 120 }).notNull(),
  summary: text('summary').notNull(),
  changeNote: varchar('change_note', { length: 500 }),
  createdBy: int('created_by').references(() => users.id),
  createdAt: createdAt(),
}, t => [uniqueIndex('procedure_versions_unique').on(t.procedureId, t.version)])

export const procedureSteps = mysqlTable('procedure_steps', {
  id: int('id').autoincrement().primaryKey(),
  versionId: int('version_id').notNull().references(() => procedureVersions.id),
  position: int('position').notNull(),
  key: varchar('step_key', { length: 60 }).notNull(),
  kind: mysqlEnum('kind', ['instruction', 'hold', 'check', 'photo', 'planner', 'signoff']).notNull(),
  title: varchar('title', { length: 160 }).notNull(),
  body: text('body').notNull(),
  guidance: text('guidance'),
  // Kind-specific settings (signal word, hazard, range, unit…), validated by shared/ schemas.
  settings: json('settings').$type<Record<string, unknown>>(),
}, t => [uniqueIndex('procedure_steps_position_unique').on(t.versionId, t.position)])

// Who may run which procedure unsupervised; everyone else runs it guided.
export const qualifications = mysqlTable('qualifications', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  userId: int('user_id').notNull().references(() => users.id),
  procedureId: int('procedure_id').notNull().references(() => procedures.id),
  grantedBy: int('granted_by').notNull().references(() => users.id),
  createdAt: createdAt(),
}, t => [uniqueIndex('qualifications_unique').on(t.userId, t.procedureId)])

// Runs and their events use client-made UUIDv7 ids so a tablet can start a run offline and a
// replayed sync can never insert the same thing twice.
export const runs = mysqlTable('runs', {
  id: varchar('id', { length: 36 }).primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  machineId: int('machine_id').notNull().references(() => machines.id),
  procedureVersionId: int('procedure_version_id').notNull().references(() => procedureVersions.id),
  startedBy: int('started_by').notNull().references(() => users.id),
  mode: mysqlEnum('mode', ['guided', 'solo']).notNull(),
  status: mysqlEnum('status', ['active', 'finished', 'abandoned']).notNull().default('active'),
  currentStepKey: varchar('current_step_key', { length: 60 }),
  startedAt: timestamp('started_at', { fsp: 3 }).notNull(),
  finishedAt: timestamp('finished_at', { fsp: 3 }),
  updatedAt: updatedAt(),
}, t => [
  index('runs_shop_status_idx').on(t.shopId, t.status),
  index('runs_machine_idx').on(t.machineId, t.startedAt),
])

export const runEvents = mysqlTable('run_events', {
  // seq orders events as the server stored them: the sync cursor.
  seq: int('seq').autoincrement().primaryKey(),
  id: varchar('id', { length: 36 }).notNull(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  runId: varchar('run_id', { length: 36 }).notNull(),
  type: varchar('type', { length: 40 }).notNull(),
  actorId: int('actor_id').notNull().references(() => users.id),
  deviceId: varchar('device_id', { length: 64 }).notNull(),
  at: timestamp('at', { fsp: 3 }).notNull(),
  receivedAt: timestamp('received_at', { fsp: 3 }).notNull().defaultNow(),
  payload: json('payload').$type<Record<string, unknown>>().notNull(),
  // Set when the fold refused the event (e.g. it arrived late and passed an open hold).
  flag: varchar('flag', { length: 60 }),
}, t => [
  uniqueIndex('run_events_id_unique').on(t.id),
  index('run_events_run_idx').on(t.runId, t.seq),
  index('run_events_shop_at_idx').on(t.shopId, t.at),
  index('run_events_shop_type_idx').on(t.shopId, t.type, t.at),
  index('run_events_shop_flag_idx').on(t.shopId, t.flag),
])

export const spoilboardReadings = mysqlTable('spoilboard_readings', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  machineId: int('machine_id').notNull().references(() => machines.id),
  takenBy: int('taken_by').notNull().references(() => users.id),
  takenAt: timestamp('taken_at', { fsp: 3 }).notNull(),
  kind: mysqlEnum('kind', ['height', 'thickness']).notNull(),
  // Grid of readings in mm, rows front to back, columns left to right.
  grid: json('grid').$type<number[][]>().notNull(),
  spacingXMm: double('spacing_x_mm').notNull(),
  spacingYMm: double('spacing_y_mm').notNull(),
  // Set when the readings follow a facing done in a run.
  runId: varchar('run_id', { length: 36 }),
  facedDepthMm: double('faced_depth_mm'),
  note: varchar('note', { length: 500 }),
  createdAt: createdAt(),
}, t => [index('spoilboard_readings_machine_idx').on(t.machineId, t.takenAt)])

export const surfacingPlans = mysqlTable('surfacing_plans', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  machineId: int('machine_id').references(() => machines.id),
  runId: varchar('run_id', { length: 36 }),
  createdBy: int('created_by').notNull().references(() => users.id),
  input: json('input').$type<Record<string, unknown>>().notNull(),
  summary: json('summary').$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
}, t => [index('surfacing_plans_run_idx').on(t.runId)])

export const maintenanceIntervals = mysqlTable('maintenance_intervals', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  procedureId: int('procedure_id').notNull().references(() => procedures.id),
  machineId: int('machine_id').references(() => machines.id),
  everyDays: int('every_days'),
  everySpindleHours: double('every_spindle_hours'),
  createdAt: createdAt(),
}, t => [index('maintenance_intervals_shop_idx').on(t.shopId)])

export const uploads = mysqlTable('uploads', {
  id: varchar('id', { length: 36 }).primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  runId: varchar('run_id', { length: 36 }),
  uploadedBy: int('uploaded_by').notNull().references(() => users.id),
  contentType: varchar('content_type', { length: 40 }).notNull(),
  bytes: int('bytes').notNull(),
  storageKey: varchar('storage_key', { length: 200 }).notNull(),
  sha256: varchar('sha256', { length: 64 }).notNull(),
  createdAt: createdAt(),
}, t => [index('uploads_shop_run_idx').on(t.shopId, t.runId)])

export const auditEntries = mysqlTable('audit_entries', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  actorId: int('actor_id').references(() => users.id),
  kind: varchar('kind', { length: 40 }).notNull(),
  subjectType: varchar('subject_type', { length: 40 }).notNull(),
  subjectId: varchar('subject_id', { length: 64 }).notNull(),
  detail: json('detail').$type<Record<string, unknown>>(),
  at: timestamp('at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
}, t => [
  index('audit_entries_shop_at_idx').on(t.shopId, t.at),
  index('audit_entries_shop_kind_idx').on(t.shopId, t.kind, t.at),
])

// A facing done in a run (the spoilboard resurfacing procedure): how deep the plan cut and the
// thickness measured afterwards, so the Board history follows the board between grid readings.
export const spoilboardFacings = mysqlTable('spoilboard_facings', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  machineId: int('machine_id').notNull().references(() => machines.id),
  runId: varchar('run_id', { length: 36 }).notNull(),
  depthMm: double('depth_mm'),
  thicknessMm: double('thickness_mm'),
  facedAt: timestamp('faced_at', { fsp: 3 }).notNull(),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('spoilboard_facings_run_unique').on(t.runId),
  index('spoilboard_facings_machine_idx').on(t.machineId, t.facedAt),
])
