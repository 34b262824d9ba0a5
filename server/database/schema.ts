import { sql } from 'drizzle-orm'
import {
  boolean, double, index, int, json, mediumtext, mysqlEnum, mysqlTable, text, timestamp, uniqueIndex, varchar,
} from 'drizzle-orm/mysql-core'
import { LEDGER_ENTRY_KINDS } from '../../shared/runs/ledger-kinds'
import { BOARD_READING_KINDS, DWELL_UNITS, RUN_MODES, RUN_STATUSES, SPINDLE_KINDS, TOOL_KINDS, UNITS } from '../../shared/rules/enums'
import { ROLES } from '../../shared/types/roles'
import { STEP_KINDS } from '../../shared/procedures/schema'
import { PAPER_SIZES, RUN_ORIGINS } from '../../shared/paper/sizes'

// One schema for the whole product. Table and column names are snake_case plurals (STYLE §4);
// every row that belongs to a shop carries shop_id so each query can be scoped to one shop.

// The choices of every enum column are written once in shared/, for this schema and zod alike.
export { DWELL_UNITS, ROLES, SPINDLE_KINDS, TOOL_KINDS }

const createdAt = () => timestamp('created_at', { fsp: 3 }).notNull().defaultNow()
const updatedAt = () => timestamp('updated_at', { fsp: 3 }).notNull().defaultNow().onUpdateNow()

export const shops = mysqlTable('shops', {
  id: int('id').autoincrement().primaryKey(),
  name: varchar('name', { length: 120 }).notNull(),
  units: mysqlEnum('units', UNITS).notNull().default('mm'),
  // Printed procedure sheets: ISO 216 A4 or ANSI Letter, whichever the shop's printers take.
  paperSize: mysqlEnum('paper_size', PAPER_SIZES).notNull().default('a4'),
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
  units: mysqlEnum('units', UNITS),
  // The person's screen and e-mail language (a file in i18n/locales); null: the browser decides.
  language: varchar('language', { length: 12 }),
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
  units: mysqlEnum('units', UNITS).notNull().default('mm'),
  spindleKind: mysqlEnum('spindle_kind', SPINDLE_KINDS).notNull(),
  hasLengthSensor: boolean('has_length_sensor').notNull().default(false),
  spoilboardMaterial: varchar('spoilboard_material', { length: 60 }).notNull().default('MDF'),
  spoilboardNominalMm: double('spoilboard_nominal_mm').notNull(),
  spoilboardMinMm: double('spoilboard_min_mm').notNull(),
  accelMmS2: double('accel_mm_s2').notNull().default(500),
  rapidMmMin: double('rapid_mm_min').notNull().default(5000),
  // How the control reads G4 P: seconds as NIST RS274/NGC (NISTIR 6556), or milliseconds.
  dwellUnit: mysqlEnum('dwell_unit', DWELL_UNITS).notNull().default('seconds'),
  notes: text('notes'),
  retiredAt: timestamp('retired_at', { fsp: 3 }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [index('machines_shop_idx').on(t.shopId)])

// The shop's cutters, picked by the Planner and Feeds. Sizes in millimetres.
export const tools = mysqlTable('tools', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  name: varchar('name', { length: 80 }).notNull(),
  kind: mysqlEnum('kind', TOOL_KINDS).notNull(),
  diameterMm: double('diameter_mm').notNull(),
  flutes: int('flutes').notNull(),
  cornerRadiusMm: double('corner_radius_mm').notNull().default(0),
  maxRpm: int('max_rpm').notNull(),
  notes: varchar('notes', { length: 500 }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [index('tools_shop_idx').on(t.shopId)])

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
  // Translations of this version's text by language, step by step (shared/procedures/translation.ts).
  // The original never changes; a translation may be written or corrected after publishing.
  translations: json('translations').$type<Record<string, unknown>>(),
  createdBy: int('created_by').references(() => users.id),
  createdAt: createdAt(),
}, t => [uniqueIndex('procedure_versions_unique').on(t.procedureId, t.version)])

export const procedureSteps = mysqlTable('procedure_steps', {
  id: int('id').autoincrement().primaryKey(),
  versionId: int('version_id').notNull().references(() => procedureVersions.id),
  position: int('position').notNull(),
  key: varchar('step_key', { length: 60 }).notNull(),
  kind: mysqlEnum('kind', STEP_KINDS).notNull(),
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
  mode: mysqlEnum('mode', RUN_MODES).notNull(),
  status: mysqlEnum('status', RUN_STATUSES).notNull().default('active'),
  currentStepKey: varchar('current_step_key', { length: 60 }),
  // Spindle time the run recorded (attached plans' cutting time and spindle-time readings),
  // kept by the fold so the due list can count spindle hours per machine.
  spindleMinutes: double('spindle_minutes').notNull().default(0),
  startedAt: timestamp('started_at', { fsp: 3 }).notNull(),
  finishedAt: timestamp('finished_at', { fsp: 3 }),
  // A run done on a printed sheet and entered afterwards (server/utils/paper-run.ts): who
  // entered it, when, and the photo of the sheet. Its events are ordinary run events.
  origin: mysqlEnum('origin', RUN_ORIGINS).notNull().default('tablet'),
  enteredBy: int('entered_by').references(() => users.id),
  enteredAt: timestamp('entered_at', { fsp: 3 }),
  sheetUploadId: varchar('sheet_upload_id', { length: 64 }),
  updatedAt: updatedAt(),
}, t => [
  index('runs_shop_status_idx').on(t.shopId, t.status),
  index('runs_machine_idx').on(t.machineId, t.startedAt),
  // The Ledger's run list: one shop's runs, newest first.
  index('runs_shop_started_idx').on(t.shopId, t.startedAt),
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
  kind: mysqlEnum('kind', BOARD_READING_KINDS).notNull(),
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

// An e-mail invitation: only the SHA-256 of the one-time token is stored, so a leaked table
// cannot be turned into working links. Accepting creates the user and stamps accepted_at.
export const invites = mysqlTable('invites', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  email: varchar('email', { length: 254 }).notNull(),
  role: mysqlEnum('role', ROLES).notNull(),
  tokenHash: varchar('token_hash', { length: 64 }).notNull(),
  invitedBy: int('invited_by').notNull().references(() => users.id),
  expiresAt: timestamp('expires_at', { fsp: 3 }).notNull(),
  acceptedAt: timestamp('accepted_at', { fsp: 3 }),
  acceptedUserId: int('accepted_user_id').references(() => users.id),
  revokedAt: timestamp('revoked_at', { fsp: 3 }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('invites_token_unique').on(t.tokenHash),
  index('invites_shop_idx').on(t.shopId, t.createdAt),
])

// Every e-mail goes through this outbox: written in the same transaction as what caused it,
// sent by a worker with retries, so a mail server that is down loses nothing. dedupe_key makes
// "send this once" (one alert per override, one digest per shop and day) a unique constraint.
export const mailOutbox = mysqlTable('mail_outbox', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').references(() => shops.id),
  kind: varchar('kind', { length: 40 }).notNull(),
  dedupeKey: varchar('dedupe_key', { length: 160 }).notNull(),
  toAddress: varchar('to_address', { length: 254 }).notNull(),
  subject: varchar('subject', { length: 200 }).notNull(),
  // MEDIUMTEXT (16 MB): a busy shop's daily digest outgrows TEXT's 64 KB.
  textBody: mediumtext('text_body').notNull(),
  htmlBody: mediumtext('html_body'),
  // An invite's one-time token, sealed with the server's secret (server/utils/invites.ts) and
  // put into the body only as the mail is sent, then cleared: backups hold no working link.
  linkSecret: varchar('link_secret', { length: 300 }),
  status: mysqlEnum('status', ['waiting', 'sent', 'failed']).notNull().default('waiting'),
  attempts: int('attempts').notNull().default(0),
  nextAttemptAt: timestamp('next_attempt_at', { fsp: 3 }).notNull().defaultNow(),
  lastError: varchar('last_error', { length: 500 }),
  messageId: varchar('message_id', { length: 200 }),
  sentAt: timestamp('sent_at', { fsp: 3 }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('mail_outbox_dedupe_unique').on(t.dedupeKey),
  index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt),
])

// What the Ledger lists: one row per event that an owner must be able to find (an override,
// an acknowledgement, a sign-off, a late event that passed an open hold, a reading out of
// range, a check skipped…), written by the sync merge from the fold, denormalised so the
// filters are plain indexed lookups. Append-only: a row is never deleted and its content never
// rewritten; when a later event changes what it means, a new row says so and the old one gets
// changed_at / changed_by (server/utils/ledger-write.ts).
export const ledgerEntries = mysqlTable('ledger_entries', {
  id: int('id').autoincrement().primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  eventId: varchar('event_id', { length: 36 }).notNull(),
  runId: varchar('run_id', { length: 36 }).notNull(),
  kind: mysqlEnum('kind', LEDGER_ENTRY_KINDS).notNull(),
  actorId: int('actor_id').notNull().references(() => users.id),
  machineId: int('machine_id').notNull().references(() => machines.id),
  procedureId: int('procedure_id').notNull().references(() => procedures.id),
  stepKey: varchar('step_key', { length: 60 }),
  // The time the event claimed (the tablet's clock); for entry-changed and backdated entries,
  // the time the server received the event, so they come first in the Ledger when they happen.
  at: timestamp('at', { fsp: 3 }).notNull(),
  // When the server received the event the entry is about.
  receivedAt: timestamp('received_at', { fsp: 3 }),
  recordedAt: timestamp('recorded_at', { fsp: 3 }).notNull().defaultNow(),
  // Identity of the row, so two merges of one run at once never append the same thing twice:
  // "<event id>:<kind>:<revision>", "changed:<entry id>" or "backdated:<event id>".
  entryKey: varchar('entry_key', { length: 100 }),
  revision: int('revision').notNull().default(1),
  counted: boolean('counted').notNull().default(true),
  changedAt: timestamp('changed_at', { fsp: 3 }),
  changedBy: int('changed_by'),
  detail: json('detail').$type<Record<string, unknown>>().notNull(),
}, t => [
  uniqueIndex('ledger_entries_entry_key_unique').on(t.entryKey),
  index('ledger_entries_run_idx').on(t.runId),
  index('ledger_entries_shop_at_idx').on(t.shopId, t.at),
  index('ledger_entries_shop_kind_idx').on(t.shopId, t.kind, t.at),
  index('ledger_entries_shop_actor_idx').on(t.shopId, t.actorId, t.at),
  index('ledger_entries_shop_machine_idx').on(t.shopId, t.machineId, t.at),
  index('ledger_entries_shop_procedure_idx').on(t.shopId, t.procedureId, t.at),
])

// Failed sign-ins, per account and per address, for throttling. Old rows are pruned.
export const signInFailures = mysqlTable('sign_in_failures', {
  id: int('id').autoincrement().primaryKey(),
  email: varchar('email', { length: 254 }).notNull(),
  address: varchar('address', { length: 64 }).notNull(),
  at: timestamp('at', { fsp: 3 }).notNull().defaultNow(),
}, t => [
  index('sign_in_failures_email_idx').on(t.email, t.at),
  index('sign_in_failures_address_idx').on(t.address, t.at),
])

// The key tablets seal sign-offs to (shared/runs/signoff-seal.ts). One row, made by the first
// app server that needs it, so every app server of a cluster opens the same seals.
export const signoffKeys = mysqlTable('signoff_keys', {
  id: int('id').primaryKey(),
  keyId: varchar('key_id', { length: 32 }).notNull(),
  publicSpki: text('public_spki').notNull(),
  privatePkcs8: text('private_pkcs8').notNull(),
  createdAt: createdAt(),
})

// Each sealed sign-off's one-time nonce, stored with the event it signed: a nonce counts once.
export const signoffNonces = mysqlTable('signoff_nonces', {
  nonce: varchar('nonce', { length: 64 }).primaryKey(),
  shopId: int('shop_id').notNull().references(() => shops.id),
  eventId: varchar('event_id', { length: 36 }).notNull(),
  signerId: int('signer_id').notNull().references(() => users.id),
  createdAt: createdAt(),
})

// --- Several app servers on one database (Galera cluster) ---

// Work that one app server at a time may do (the mail sender, the daily digest): whoever holds
// the row's unexpired lease does it. `doneFor` remembers the last period a once-only job ran for
// (the digest's day), so it runs once for the whole cluster, not once per server.
export const workerLeases = mysqlTable('worker_leases', {
  name: varchar('name', { length: 64 }).primaryKey(),
  holder: varchar('holder', { length: 96 }).notNull(),
  expiresAt: timestamp('expires_at', { fsp: 3 }).notNull(),
  doneFor: varchar('done_for', { length: 32 }),
})

// Sessions signed out before their cookie expires; every app server checks them (authz.ts).
export const revokedSessions = mysqlTable('revoked_sessions', {
  sessionId: varchar('session_id', { length: 64 }).primaryKey(),
  until: timestamp('until', { fsp: 3 }).notNull(),
}, t => [index('revoked_sessions_until_idx').on(t.until)])

// One row per run, bumped by a trigger on every stored run event (see the migration), so two
// merges of the same run write the same row: on one server the second waits for the first and
// then folds all of its events; on a Galera cluster the second fails certification and is
// retried (withWriteRetry). Without it two concurrent merges could each fold only their own
// half and leave a stale run summary.
export const runMerges = mysqlTable('run_merges', {
  runId: varchar('run_id', { length: 36 }).primaryKey(),
  merges: int('merges').notNull().default(0),
})
