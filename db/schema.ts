// Causeway's tables. Every record that belongs to a shop carries shop_id; services filter on it.
import { sql } from 'drizzle-orm';
import {
  bigint,
  boolean,
  char,
  datetime,
  index,
  int,
  json,
  longtext,
  mediumtext,
  mysqlEnum,
  mysqlTable,
  primaryKey,
  smallint,
  text,
  uniqueIndex,
  varchar,
} from 'drizzle-orm/mysql-core';
import { caseStatuses, roles } from '../shared/roles';

// serial() does not work on MariaDB; this is the equivalent.
const id = () => bigint('id', { mode: 'number', unsigned: true }).autoincrement().primaryKey();
const ref = (name: string) => bigint(name, { mode: 'number', unsigned: true });
const createdAt = () => datetime('created_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`);

export const shops = mysqlTable('shops', {
  id: id(),
  name: varchar('name', { length: 120 }).notNull(),
  comebackDays: smallint('comeback_days').notNull().default(90),
  comebackKm: int('comeback_km').notNull().default(3000),
  /** id of a rule set in shared/readiness/verdict.ts */
  readinessRule: varchar('readiness_rule', { length: 32 }).notNull().default('us-common'),
  /** ISO 3166-1 alpha-2; null until the manager sets it. */
  country: varchar('country', { length: 2 }),
  /** IANA zone: "today", the digest week and dates on screen follow it. */
  timeZone: varchar('time_zone', { length: 64 }).notNull().default('UTC'),
  createdAt: createdAt(),
});

export const users = mysqlTable(
  'users',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    name: varchar('name', { length: 120 }).notNull(),
    email: varchar('email', { length: 254 }).notNull(),
    /** Short name used by case files in content/ (e.g. "senior"); optional. */
    handle: varchar('handle', { length: 40 }),
    role: mysqlEnum('role', roles).notNull(),
    passwordHash: varchar('password_hash', { length: 255 }),
    disabled: boolean('disabled').notNull().default(false),
    failedLogins: int('failed_logins').notNull().default(0),
    lockedUntil: datetime('locked_until', { fsp: 3 }),
    passwordChangedAt: datetime('password_changed_at', { fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('users_email').on(t.email), index('users_shop').on(t.shopId), uniqueIndex('users_shop_handle').on(t.shopId, t.handle)],
);

/** One-time tokens for invites and password resets; only the SHA-256 of the token is stored. */
export const authTokens = mysqlTable(
  'auth_tokens',
  {
    id: id(),
    userId: ref('user_id').notNull().references(() => users.id),
    purpose: mysqlEnum('purpose', ['invite', 'reset']).notNull(),
    tokenHash: char('token_hash', { length: 64 }).notNull(),
    expiresAt: datetime('expires_at', { fsp: 3 }).notNull(),
    usedAt: datetime('used_at', { fsp: 3 }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('auth_tokens_hash').on(t.tokenHash), index('auth_tokens_user').on(t.userId)],
);

/** express-mysql-session's table, owned by our migrations instead of created at run time. */
export const sessions = mysqlTable(
  'sessions',
  {
    sessionId: varchar('session_id', { length: 128 }).primaryKey(),
    expires: int('expires', { unsigned: true }).notNull(),
    data: mediumtext('data'),
  },
  (t) => [index('sessions_expires').on(t.expires)],
);

/** Hit counters of the request limits (sign-in, sign-up, reset), shared by every app instance. */
export const rateLimits = mysqlTable(
  'rate_limits',
  {
    rateKey: varchar('rate_key', { length: 191 }).primaryKey(),
    hits: int('hits', { unsigned: true }).notNull(),
    resetAt: datetime('reset_at', { fsp: 3 }).notNull(),
  },
  (t) => [index('rate_limits_reset').on(t.resetAt)],
);

export const platforms = mysqlTable(
  'platforms',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    key: varchar('key', { length: 64 }),
    make: varchar('make', { length: 60 }).notNull(),
    model: varchar('model', { length: 60 }).notNull(),
    engine: varchar('engine', { length: 30 }).notNull(),
    yearFrom: smallint('year_from').notNull(),
    yearTo: smallint('year_to').notNull(),
    cylinders: smallint('cylinders').notNull(),
    layout: mysqlEnum('layout', ['inline', 'V', 'flat']).notNull(),
    banks: json('banks').$type<{ '1': number[]; '2': number[] } | null>(),
    firingOrder: json('firing_order').$type<number[] | null>(),
    fuel: mysqlEnum('fuel', ['petrol', 'diesel', 'hybrid', 'electric']),
    induction: mysqlEnum('induction', ['natural', 'turbo', 'supercharged']),
    createdAt: createdAt(),
  },
  (t) => [index('platforms_shop').on(t.shopId), uniqueIndex('platforms_shop_key').on(t.shopId, t.key)],
);

export const vehicles = mysqlTable(
  'vehicles',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    vin: char('vin', { length: 17 }).notNull(),
    plate: varchar('plate', { length: 20 }),
    fleetNumber: varchar('fleet_number', { length: 30 }),
    platformId: ref('platform_id').references(() => platforms.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('vehicles_shop_vin').on(t.shopId, t.vin)],
);

export const cases = mysqlTable(
  'cases',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    slug: varchar('slug', { length: 120 }),
    title: varchar('title', { length: 200 }).notNull(),
    body: longtext('body').notNull(),
    platformId: ref('platform_id').references(() => platforms.id),
    vehicleId: ref('vehicle_id').references(() => vehicles.id),
    mileage: int('mileage', { unsigned: true }),
    mileageUnit: mysqlEnum('mileage_unit', ['km', 'mi']),
    visitDate: varchar('visit_date', { length: 10 }),
    codes: json('codes').$type<string[]>().notNull(),
    symptoms: json('symptoms').$type<string[]>().notNull(),
    context: json('context').$type<string[]>().notNull(),
    rootCause: text('root_cause'),
    fix: text('fix'),
    cause: varchar('cause', { length: 120 }),
    /** Who linked `cause`: the author (editor, walk, import) or the server's suggestion at confirm time. */
    causeLinkedBy: mysqlEnum('cause_linked_by', ['author', 'suggestion']),
    status: mysqlEnum('status', caseStatuses).notNull().default('draft'),
    authorId: ref('author_id').notNull().references(() => users.id),
    confirmedById: ref('confirmed_by_id').references(() => users.id),
    confirmedAt: datetime('confirmed_at', { fsp: 3 }),
    confirmNote: text('confirm_note'),
    version: int('version').notNull().default(1),
    deletedAt: datetime('deleted_at', { fsp: 3 }),
    createdAt: createdAt(),
    updatedAt: datetime('updated_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [
    index('cases_shop_updated').on(t.shopId, t.updatedAt),
    index('cases_shop_status').on(t.shopId, t.status),
    index('cases_shop_platform').on(t.shopId, t.platformId),
    // covers search reconciliation's per-shop count and versions of live cases (server/search/reconcile.ts)
    index('cases_shop_live_version').on(t.shopId, t.deletedAt, t.version),
    index('cases_vehicle').on(t.vehicleId),
    uniqueIndex('cases_shop_slug').on(t.shopId, t.slug),
  ],
);

/** Exact-lookup rows for a case's codes and tags, kept in step with cases.codes / cases.symptoms. */
export const caseCodes = mysqlTable(
  'case_codes',
  {
    caseId: ref('case_id').notNull().references(() => cases.id),
    code: char('code', { length: 5 }).notNull(),
    ftb: char('ftb', { length: 2 }).notNull().default(''),
  },
  (t) => [primaryKey({ columns: [t.caseId, t.code, t.ftb] }), index('case_codes_code').on(t.code)],
);

export const caseTags = mysqlTable(
  'case_tags',
  {
    caseId: ref('case_id').notNull().references(() => cases.id),
    tag: varchar('tag', { length: 60 }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.caseId, t.tag] }), index('case_tags_tag').on(t.tag)],
);

export const caseRevisions = mysqlTable(
  'case_revisions',
  {
    id: id(),
    caseId: ref('case_id').notNull().references(() => cases.id),
    version: int('version').notNull(),
    title: varchar('title', { length: 200 }).notNull(),
    body: longtext('body').notNull(),
    fields: json('fields').$type<Record<string, unknown>>().notNull(),
    authorId: ref('author_id').notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('case_revisions_case_version').on(t.caseId, t.version)],
);

export const caseComments = mysqlTable(
  'case_comments',
  {
    id: id(),
    caseId: ref('case_id').notNull().references(() => cases.id),
    authorId: ref('author_id').notNull().references(() => users.id),
    kind: mysqlEnum('kind', ['comment', 'returned', 'submitted', 'published', 'confirmed']).notNull(),
    body: text('body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('case_comments_case').on(t.caseId)],
);

export const attachments = mysqlTable(
  'attachments',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    caseId: ref('case_id').notNull().references(() => cases.id),
    storedName: char('stored_name', { length: 36 }).notNull(),
    originalName: varchar('original_name', { length: 200 }).notNull(),
    mime: varchar('mime', { length: 60 }).notNull(),
    size: int('size', { unsigned: true }).notNull(),
    sha256: char('sha256', { length: 64 }).notNull(),
    uploadedById: ref('uploaded_by_id').notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index('attachments_case').on(t.caseId), uniqueIndex('attachments_stored').on(t.storedName)],
);

/** Append-only feed of changes that app instances follow to keep their search indexes live. */
export const changeLog = mysqlTable(
  'change_log',
  {
    id: id(),
    shopId: ref('shop_id').notNull(),
    entity: varchar('entity', { length: 20 }).notNull(),
    entityId: ref('entity_id').notNull(),
    op: mysqlEnum('op', ['upsert', 'delete']).notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('change_log_created').on(t.createdAt)],
);

/** Small facts about this database, e.g. that the demo data was loaded once. */
export const appMeta = mysqlTable('app_meta', {
  key: varchar('key', { length: 64 }).primaryKey(),
  value: text('value').notNull(),
  updatedAt: datetime('updated_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
});

/** A tech's cause walk: the evidence it started from and the walk state (shared/walk) as JSON. */
export const walks = mysqlTable(
  'walks',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    userId: ref('user_id').notNull().references(() => users.id),
    platformId: ref('platform_id').references(() => platforms.id),
    treeId: varchar('tree_id', { length: 60 }).notNull(),
    evidence: json('evidence').$type<Record<string, unknown>>().notNull(),
    state: json('state').$type<Record<string, unknown>>().notNull(),
    status: mysqlEnum('status', ['open', 'finished']).notNull().default('open'),
    caseId: ref('case_id').references(() => cases.id),
    version: int('version').notNull().default(1),
    createdAt: createdAt(),
    updatedAt: datetime('updated_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [index('walks_shop_user').on(t.shopId, t.userId, t.updatedAt)],
);

/** A shop's own edit of a cause tree; it replaces the tree of the same id from content/trees. */
export const causeTrees = mysqlTable(
  'cause_trees',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    treeId: varchar('tree_id', { length: 60 }).notNull(),
    definition: json('definition').$type<Record<string, unknown>>().notNull(),
    updatedById: ref('updated_by_id').notNull().references(() => users.id),
    updatedAt: datetime('updated_at', { fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  },
  (t) => [uniqueIndex('cause_trees_shop_tree').on(t.shopId, t.treeId)],
);

/** Each digest e-mail sent, so the weekly scheduler never sends twice across instances. */
export const digestRuns = mysqlTable(
  'digest_runs',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    periodKey: varchar('period_key', { length: 20 }).notNull(),
    kind: mysqlEnum('kind', ['scheduled', 'manual']).notNull(),
    recipients: int('recipients').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('digest_runs_shop').on(t.shopId, t.createdAt), uniqueIndex('digest_runs_period').on(t.shopId, t.periodKey, t.kind)],
);

/** Monitor status read on a case (before and after a drive cycle); the verdict is worked out on reading. */
export const readinessSnapshots = mysqlTable(
  'readiness_snapshots',
  {
    id: id(),
    shopId: ref('shop_id').notNull().references(() => shops.id),
    caseId: ref('case_id').notNull().references(() => cases.id),
    label: varchar('label', { length: 80 }).notNull(),
    mil: boolean('mil'),
    confirmedCodes: smallint('confirmed_codes'),
    ignition: mysqlEnum('ignition', ['spark', 'compression']).notNull(),
    monitors: json('monitors').$type<{ key: string; supported: boolean; complete: boolean }[]>().notNull(),
    modelYear: smallint('model_year'),
    takenById: ref('taken_by_id').notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index('readiness_snapshots_case').on(t.caseId, t.createdAt)],
);
