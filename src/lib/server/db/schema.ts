// Linkwright's tables. Lengths in mm and angles in degrees wherever a column holds geometry.
import { sql } from 'drizzle-orm';
import { CORNER_KINDS } from '../../kinds';
import {
	bigint,
	bigserial,
	boolean,
	check,
	customType,
	doublePrecision,
	index,
	integer,
	jsonb,
	pgTable,
	primaryKey,
	real,
	text,
	timestamp,
	uniqueIndex,
	uuid,
	type AnyPgColumn
} from 'drizzle-orm/pg-core';

export const ROLES = ['owner', 'engineer', 'viewer'] as const;
export const CORNER_POSITIONS = ['front_left', 'front_right', 'rear_left', 'rear_right'] as const;
/** The suspension kinds: the one list of the kinds' descriptions (src/lib/kinds). */
export const SUSPENSION_KINDS = CORNER_KINDS;
export const DRIVE_LAYOUTS = ['fwd', 'rwd', 'awd'] as const;
export const SHARE_SCOPES = ['revision', 'car', 'axle'] as const;
/** The axles a share link of scope 'axle' may carry. */
export const SHARE_AXLES = ['front', 'rear'] as const;

/** SQL `col IN ('a','b')` for a check constraint over a fixed set of values. */
function oneOf(column: AnyPgColumn, values: readonly string[]) {
	return sql`${column} in (${sql.raw(values.map((v) => `'${v}'`).join(', '))})`;
}

const bytea = customType<{ data: Buffer; driverData: Buffer }>({
	dataType: () => 'bytea'
});

const created = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const users = pgTable(
	'users',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		email: text('email').notNull(),
		name: text('name').notNull(),
		passwordHash: text('password_hash').notNull(),
		// Lengths on screen, in the share sheet's default and in CSV downloads: millimetres or inches (stored values stay mm).
		lengthUnit: text('length_unit', { enum: ['mm', 'in'] }).notNull().default('mm'),
		createdAt: created()
	},
	(t) => [
		uniqueIndex('users_email_key').on(t.email),
		check('users_email_lower', sql`${t.email} = lower(${t.email})`),
		check('users_length_unit_check', sql`${t.lengthUnit} in ('mm', 'in')`)
	]
);

export const teams = pgTable('teams', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name').notNull(),
	settings: jsonb('settings').$type<Record<string, unknown>>().notNull().default({}),
	createdAt: created()
});

export const memberships = pgTable(
	'memberships',
	{
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
		role: text('role', { enum: ROLES }).notNull(),
		createdAt: created()
	},
	(t) => [
		primaryKey({ columns: [t.teamId, t.userId] }),
		index('memberships_user_idx').on(t.userId),
		check('memberships_role_check', oneOf(t.role, ROLES))
	]
);

export const cars = pgTable(
	'cars',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		series: text('series').notNull().default(''),
		wheelbaseMm: doublePrecision('wheelbase_mm'),
		cgHeightMm: doublePrecision('cg_height_mm'),
		frontBrakeFraction: doublePrecision('front_brake_fraction'),
		driveLayout: text('drive_layout', { enum: DRIVE_LAYOUTS }),
		notes: text('notes').notNull().default(''),
		targets: jsonb('targets').$type<unknown[]>().notNull().default([]),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [
		index('cars_team_idx').on(t.teamId, t.name),
		check('cars_drive_layout_check', sql`${t.driveLayout} is null or ${oneOf(t.driveLayout, DRIVE_LAYOUTS)}`),
		check('cars_wheelbase_positive', sql`${t.wheelbaseMm} is null or ${t.wheelbaseMm} > 0`),
		check('cars_cg_positive', sql`${t.cgHeightMm} is null or ${t.cgHeightMm} > 0`),
		check(
			'cars_brake_fraction_range',
			sql`${t.frontBrakeFraction} is null or (${t.frontBrakeFraction} >= 0 and ${t.frontBrakeFraction} <= 1)`
		)
	]
);

export const corners = pgTable(
	'corners',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		carId: uuid('car_id').notNull().references(() => cars.id, { onDelete: 'cascade' }),
		position: text('position', { enum: CORNER_POSITIONS }).notNull(),
		kind: text('kind', { enum: SUSPENSION_KINDS }).notNull(),
		// The baseline is a pointer kept on the corner, so revisions themselves never change.
		baselineRevisionId: uuid('baseline_revision_id').references((): AnyPgColumn => revisions.id, {
			onDelete: 'set null'
		}),
		// Per joint (point name): the misalignment limit in degrees and the stud or bolt axis (issue 19); the engineer's
		// settings, not geometry, so they live on the corner and every revision is judged by them.
		jointSettings: jsonb('joint_settings').$type<Record<string, { limit?: number; axis?: 'auto' | 'x' | 'y' | 'z' }>>().notNull().default({}),
		createdAt: created()
	},
	(t) => [
		uniqueIndex('corners_car_position_key').on(t.carId, t.position),
		check('corners_position_check', oneOf(t.position, CORNER_POSITIONS)),
		check('corners_kind_check', oneOf(t.kind, SUSPENSION_KINDS))
	]
);

export const revisions = pgTable(
	'revisions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		cornerId: uuid('corner_id').notNull().references(() => corners.id, { onDelete: 'cascade' }),
		number: integer('number').notNull(),
		label: text('label').notNull().default(''),
		note: text('note').notNull().default(''),
		kind: text('kind', { enum: SUSPENSION_KINDS }).notNull(),
		geometry: jsonb('geometry').$type<Record<string, unknown>>().notNull(),
		parentId: uuid('parent_id').references((): AnyPgColumn => revisions.id, { onDelete: 'restrict' }),
		authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created()
	},
	(t) => [
		uniqueIndex('revisions_corner_number_key').on(t.cornerId, t.number),
		index('revisions_parent_idx').on(t.parentId),
		check('revisions_number_positive', sql`${t.number} > 0`),
		check('revisions_kind_check', oneOf(t.kind, SUSPENSION_KINDS))
	]
);

/**
 * A car revision: an immutable snapshot of the car's own model (mass items, springs, bars, steering: `car-model/1`)
 * pinning one revision of each corner it analyses. Numbered per car like corner revisions.
 */
export const carRevisions = pgTable(
	'car_revisions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		carId: uuid('car_id').notNull().references(() => cars.id, { onDelete: 'cascade' }),
		number: integer('number').notNull(),
		label: text('label').notNull().default(''),
		note: text('note').notNull().default(''),
		model: jsonb('model').$type<Record<string, unknown>>().notNull(),
		/** position → the pinned corner revision's id */
		cornerRevisions: jsonb('corner_revisions').$type<Record<string, string>>().notNull(),
		parentId: uuid('parent_id').references((): AnyPgColumn => carRevisions.id, { onDelete: 'restrict' }),
		authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created()
	},
	(t) => [uniqueIndex('car_revisions_car_number_key').on(t.carId, t.number), check('car_revisions_number_positive', sql`${t.number} > 0`)]
);

export const uploads = pgTable(
	'uploads',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		revisionId: uuid('revision_id').references(() => revisions.id, { onDelete: 'set null' }),
		filename: text('filename').notNull(),
		contentType: text('content_type').notNull(),
		sizeBytes: integer('size_bytes').notNull(),
		sha256: text('sha256').notNull(),
		bytes: bytea('bytes').notNull(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created()
	},
	(t) => [index('uploads_team_idx').on(t.teamId, t.createdAt), index('uploads_revision_idx').on(t.revisionId)]
);

export const studies = pgTable(
	'studies',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		cornerId: uuid('corner_id').notNull().references(() => corners.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		settings: jsonb('settings').$type<Record<string, unknown>>().notNull(),
		results: jsonb('results').$type<Record<string, unknown>>(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created(),
		updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow()
	},
	(t) => [index('studies_corner_idx').on(t.cornerId, t.name)]
);

/** Design-space explorations (issue 18): the spec, and how far the queue's workers have got. */
export const explorations = pgTable(
	'explorations',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		cornerId: uuid('corner_id').notNull().references(() => corners.id, { onDelete: 'cascade' }),
		revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
		spec: jsonb('spec').$type<Record<string, unknown>>().notNull(),
		variants: integer('variants').notNull(),
		chunkSize: integer('chunk_size').notNull(),
		chunks: integer('chunks').notNull(),
		/** chunks stored so far: one counter bumped by the chunk's own transaction (the last one marks the study done) */
		chunksDone: integer('chunks_done').notNull().default(0),
		status: text('status', { enum: ['queued', 'done', 'cancelled', 'failed'] }).notNull().default('queued'),
		error: text('error'),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created(),
		finishedAt: timestamp('finished_at', { withTimezone: true })
	},
	(t) => [index('explorations_corner_idx').on(t.cornerId, t.createdAt)]
);

/** One row per solved chunk: written once (the key is study + chunk), so a retried chunk never counts twice. */
export const explorationChunks = pgTable(
	'exploration_chunks',
	{
		explorationId: uuid('exploration_id').notNull().references(() => explorations.id, { onDelete: 'cascade' }),
		chunk: integer('chunk').notNull(),
		feasible: integer('feasible').notNull(),
		doneAt: created()
	},
	(t) => [primaryKey({ columns: [t.explorationId, t.chunk] })]
);

/**
 * One row per variant (offsets are recomputed from the spec and index); measures null where it does not assemble or
 * not kept. No foreign key (its check per row doubled the cost of a chunk's write): a variant is written in the
 * transaction that inserts its chunk's row, whose key does reference the study, and the trigger of migration 0010
 * deletes a study's variants with it.
 */
export const explorationVariants = pgTable(
	'exploration_variants',
	{
		explorationId: uuid('exploration_id').notNull(),
		idx: integer('idx').notNull(),
		ok: boolean('ok').notNull(),
		toeRms: real('toe_rms'),
		camberGain: real('camber_gain'),
		rcHeight: real('rc_height'),
		rcMigration: real('rc_migration'),
		motionRatio: real('motion_ratio'),
		/** this wheel's overall steering ratio at straight ahead (steering-wheel ° per road-wheel °), with the car model's steering */
		steerRatio: real('steer_ratio'),
		/** clear of the car model's keep-out volumes through the travel (and at the steering lock); null: none checked */
		clear: boolean('clear')
	},
	(t) => [primaryKey({ columns: [t.explorationId, t.idx] })]
);

export const shareLinks = pgTable(
	'share_links',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull(),
		scope: text('scope', { enum: SHARE_SCOPES }).notNull(),
		revisionId: uuid('revision_id').references(() => revisions.id, { onDelete: 'cascade' }),
		carId: uuid('car_id').references(() => cars.id, { onDelete: 'cascade' }),
		/** scope 'axle': one axle of one car revision (both sides, steering, figures) */
		carRevisionId: uuid('car_revision_id').references((): AnyPgColumn => carRevisions.id, { onDelete: 'cascade' }),
		axle: text('axle', { enum: SHARE_AXLES }),
		note: text('note').notNull().default(''),
		/** the address the link was mailed to when it was made (shown in the list of links); null when none */
		sentTo: text('sent_to'),
		/** the sheet shows the revision's internal note only when the engineer ticked it for this link */
		showRevisionNote: boolean('show_revision_note').notNull().default(false),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		revokedAt: timestamp('revoked_at', { withTimezone: true }),
		lastOpenedAt: timestamp('last_opened_at', { withTimezone: true }),
		openCount: integer('open_count').notNull().default(0),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created()
	},
	(t) => [
		uniqueIndex('share_links_token_key').on(t.tokenHash),
		index('share_links_revision_idx').on(t.revisionId, t.createdAt),
		index('share_links_car_idx').on(t.carId, t.createdAt),
		index('share_links_car_revision_idx').on(t.carRevisionId, t.createdAt),
		check('share_links_scope_check', oneOf(t.scope, SHARE_SCOPES)),
		check('share_links_axle_check', sql`${t.axle} is null or ${oneOf(t.axle, SHARE_AXLES)}`),
		check(
			'share_links_scope_target',
			sql`(${t.scope} = 'revision' and ${t.revisionId} is not null) or (${t.scope} = 'car' and ${t.carId} is not null) or (${t.scope} = 'axle' and ${t.carRevisionId} is not null and ${t.axle} is not null)`
		)
	]
);

export const invitations = pgTable(
	'invitations',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		email: text('email').notNull(),
		role: text('role', { enum: ROLES }).notNull(),
		tokenHash: text('token_hash').notNull(),
		invitedBy: uuid('invited_by').references(() => users.id, { onDelete: 'set null' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		acceptedAt: timestamp('accepted_at', { withTimezone: true }),
		cancelledAt: timestamp('cancelled_at', { withTimezone: true }),
		createdAt: created()
	},
	(t) => [
		uniqueIndex('invitations_token_key').on(t.tokenHash),
		index('invitations_team_idx').on(t.teamId, t.createdAt),
		check('invitations_role_check', oneOf(t.role, ROLES))
	]
);

export const passwordResets = pgTable(
	'password_resets',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull(),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		usedAt: timestamp('used_at', { withTimezone: true }),
		createdAt: created()
	},
	(t) => [uniqueIndex('password_resets_token_key').on(t.tokenHash), index('password_resets_user_idx').on(t.userId)]
);

// One row per signed-in browser session: the session cookie (a signed JWT) carries the row's id, and every
// request checks that the row is not revoked, so sign-out, a password reset, a removal from a team and "sign out
// everywhere" end sessions at once.
export const sessions = pgTable(
	'sessions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
		expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
		revokedAt: timestamp('revoked_at', { withTimezone: true }),
		createdAt: created()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

// Browsers that have signed in to an account before (a long-lived cookie holding a random token, stored hashed):
// sign-in from a known device is not held back by the failures of others at the same address.
export const knownDevices = pgTable(
	'known_devices',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
		tokenHash: text('token_hash').notNull(),
		lastUsedAt: timestamp('last_used_at', { withTimezone: true }).notNull().defaultNow(),
		createdAt: created()
	},
	(t) => [uniqueIndex('known_devices_token_user_key').on(t.tokenHash, t.userId), index('known_devices_user_idx').on(t.userId)]
);

export const apiTokens = pgTable(
	'api_tokens',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
		name: text('name').notNull(),
		tokenHash: text('token_hash').notNull(),
		lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
		revokedAt: timestamp('revoked_at', { withTimezone: true }),
		createdAt: created()
	},
	(t) => [uniqueIndex('api_tokens_token_key').on(t.tokenHash), index('api_tokens_user_idx').on(t.userId)]
);

export const auditEvents = pgTable(
	'audit_events',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		teamId: uuid('team_id').notNull().references(() => teams.id, { onDelete: 'cascade' }),
		actorId: uuid('actor_id').references(() => users.id, { onDelete: 'set null' }),
		action: text('action').notNull(),
		subjectType: text('subject_type').notNull(),
		subjectId: text('subject_id'),
		detail: jsonb('detail').$type<Record<string, unknown>>().notNull().default({}),
		createdAt: created()
	},
	(t) => [index('audit_events_team_idx').on(t.teamId, t.createdAt)]
);

export const loginAttempts = pgTable(
	'login_attempts',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		email: text('email').notNull(),
		address: text('address').notNull(),
		/** the known device's token hash when the attempt came from one (its failures count against it, not the address) */
		device: text('device'),
		succeeded: boolean('succeeded').notNull(),
		createdAt: created()
	},
	(t) => [
		index('login_attempts_email_idx').on(t.email, t.createdAt),
		index('login_attempts_address_idx').on(t.address, t.createdAt)
	]
);

// Counted events for rate limits (share-link opens, mails sent, reset requests), kept in the database so
// every app instance sees the same counts. Old rows are pruned as new ones are written.
export const rateEvents = pgTable(
	'rate_events',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		bucket: text('bucket').notNull(),
		key: text('key').notNull(),
		createdAt: created()
	},
	(t) => [index('rate_events_bucket_key_idx').on(t.bucket, t.key, t.createdAt)]
);

export const SCAN_FORMATS = ['stl', 'ply', 'obj'] as const;
export const SCAN_STATUSES = ['uploading', 'processing', 'ready', 'failed'] as const;
export const SCAN_UNITS = ['mm', 'm', 'in'] as const;

/**
 * A 3-D scan of a corner's chassis and suspension (issue 17): team data through its car, under the same
 * permissions as revisions. The original file and its preview live in object storage under `object_key` and
 * `preview_key`; `upload_id` is the open multipart upload while `status` is 'uploading'. `status_at` is when the
 * status last changed, so a row left 'uploading' or 'processing' by a crash is swept to 'failed'.
 */
export const scans = pgTable(
	'scans',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		carId: uuid('car_id').notNull().references(() => cars.id, { onDelete: 'cascade' }),
		cornerId: uuid('corner_id').references(() => corners.id, { onDelete: 'set null' }),
		name: text('name').notNull(),
		format: text('format', { enum: SCAN_FORMATS }).notNull(),
		sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
		objectKey: text('object_key').notNull(),
		uploadId: text('upload_id'),
		previewKey: text('preview_key'),
		status: text('status', { enum: SCAN_STATUSES }).notNull().default('uploading'),
		statusAt: timestamp('status_at', { withTimezone: true }).notNull().defaultNow(),
		error: text('error'),
		stats: jsonb('stats').$type<Record<string, unknown>>(),
		unit: text('unit', { enum: SCAN_UNITS }),
		alignment: jsonb('alignment').$type<Record<string, unknown>>(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: created()
	},
	(t) => [
		index('scans_car_idx').on(t.carId, t.createdAt),
		index('scans_status_idx').on(t.status, t.statusAt),
		check('scans_format_check', oneOf(t.format, SCAN_FORMATS)),
		check('scans_status_check', oneOf(t.status, SCAN_STATUSES)),
		check('scans_size_check', sql`${t.sizeBytes} > 0`)
	]
);

/**
 * Where a revision's point came from when it was captured on a scan: the scan (its name kept when the scan is
 * deleted), the fit, its residual RMS (mm) and how many surface points it used. Written with the revision.
 */
export const pointSources = pgTable(
	'point_sources',
	{
		revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
		point: text('point').notNull(),
		scanId: uuid('scan_id').references(() => scans.id, { onDelete: 'set null' }),
		scanName: text('scan_name').notNull(),
		fit: text('fit').notNull(),
		residualMm: doublePrecision('residual_mm'),
		pointsUsed: integer('points_used'),
		createdAt: created()
	},
	(t) => [primaryKey({ columns: [t.revisionId, t.point] })]
);

export type Scan = typeof scans.$inferSelect;
export type PointSource = typeof pointSources.$inferSelect;
export type User = typeof users.$inferSelect;
export type Team = typeof teams.$inferSelect;
export type Membership = typeof memberships.$inferSelect;
export type Car = typeof cars.$inferSelect;
export type CarRevision = typeof carRevisions.$inferSelect;
export type Corner = typeof corners.$inferSelect;
export type Revision = typeof revisions.$inferSelect;
export type Role = (typeof ROLES)[number];
export type ShareLink = typeof shareLinks.$inferSelect;
export type Invitation = typeof invitations.$inferSelect;

/**
 * A large tolerance study run through the job queue (issue 18; ≥ 20,000 samples): the engine's spec, and its
 * chunks' solved samples until the request that queued it has read them (then the row is deleted with its chunks).
 */
export const toleranceRuns = pgTable('tolerance_runs', {
	id: uuid('id').primaryKey().defaultRandom(),
	revisionId: uuid('revision_id').notNull().references(() => revisions.id, { onDelete: 'cascade' }),
	spec: jsonb('spec').$type<Record<string, unknown>>().notNull(),
	samples: integer('samples').notNull(),
	chunkSize: integer('chunk_size').notNull(),
	chunks: integer('chunks').notNull(),
	chunksDone: integer('chunks_done').notNull().default(0),
	status: text('status', { enum: ['queued', 'done', 'cancelled', 'failed'] }).notNull().default('queued'),
	error: text('error'),
	createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
	createdAt: created()
});

/** One solved chunk of a queued tolerance study: its samples' values (float64, little-endian) and ok flags, written once. */
export const toleranceChunks = pgTable(
	'tolerance_chunks',
	{
		runId: uuid('run_id').notNull().references(() => toleranceRuns.id, { onDelete: 'cascade' }),
		chunk: integer('chunk').notNull(),
		ok: bytea('ok').notNull(),
		values: bytea('values').notNull()
	},
	(t) => [primaryKey({ columns: [t.runId, t.chunk] })]
);
