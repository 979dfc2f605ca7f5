/**
 * The Keelson database schema: the single source of truth for every table. After a change run
 * `npm run db:generate` (drizzle-kit) and commit the new file under `libs/db/migrations`.
 *
 * Conventions: times are ISO-8601 UTC strings (`2026-03-01T09:30:00.000Z`) in `text` columns, so
 * they sort as text and read well in the SQLite shell; booleans are integers (0/1) mapped by
 * Drizzle; e-mail addresses are stored lower-case (a CHECK enforces it).
 */
import { sql } from 'drizzle-orm';
import {
  blob,
  check,
  index,
  integer,
  primaryKey,
  real,
  sqliteTable,
  text,
  uniqueIndex,
} from 'drizzle-orm/sqlite-core';

/**
 * The roles a user can hold. The same list as `ROLES` in `@keelson/contracts` (a spec checks that
 * they agree); kept here as a literal because drizzle-kit reads this file on its own.
 */
export const USER_ROLES = ['admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer'] as const;

/** People who sign in to Keelson. */
export const users = sqliteTable(
  'users',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    email: text('email').notNull(),
    name: text('name').notNull(),
    /** bcrypt hash; null until the user accepts the invitation and sets a password. */
    passwordHash: text('password_hash'),
    role: text('role', { enum: USER_ROLES }).notNull(),
    isActive: integer('is_active', { mode: 'boolean' }).notNull().default(true),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    lastLoginAt: text('last_login_at'),
  },
  (table) => [
    uniqueIndex('users_email_unique').on(table.email),
    index('users_role_index').on(table.role),
    check('users_email_lower_case', sql`${table.email} = lower(${table.email})`),
    check(
      'users_role_known',
      sql`${table.role} in ('admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer')`,
    ),
  ],
);

/** The organisation's sites (plants), to which plant managers belong. */
export const plants = sqliteTable('plants', {
  code: text('code').primaryKey(),
  name: text('name').notNull(),
  /** ISO 3166-1 alpha-2 country code. */
  country: text('country').notNull(),
});

/** Which plants a plant manager manages. */
export const userPlants = sqliteTable(
  'user_plants',
  {
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    plantCode: text('plant_code')
      .notNull()
      .references(() => plants.code, { onDelete: 'cascade', onUpdate: 'cascade' }),
  },
  (table) => [
    primaryKey({ columns: [table.userId, table.plantCode] }),
    index('user_plants_plant_index').on(table.plantCode),
  ],
);

/** Set-password invitations. Only the SHA-256 hash of the token is stored. */
export const invitations = sqliteTable(
  'invitations',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    tokenHash: text('token_hash').notNull(),
    userId: integer('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    createdAt: text('created_at').notNull(),
    expiresAt: text('expires_at').notNull(),
    usedAt: text('used_at'),
  },
  (table) => [
    uniqueIndex('invitations_token_hash_unique').on(table.tokenHash),
    index('invitations_user_index').on(table.userId),
  ],
);

/** Messages caught by the in-process SMTP sink (demo and test modes). */
export const mailMessages = sqliteTable(
  'mail_messages',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    fromAddress: text('from_address').notNull(),
    /** JSON array of recipient addresses. */
    toAddresses: text('to_addresses', { mode: 'json' }).$type<string[]>().notNull(),
    subject: text('subject').notNull(),
    text: text('text'),
    html: text('html'),
    /** Size of the raw message in bytes, as received. */
    rawSize: integer('raw_size').notNull(),
    receivedAt: text('received_at').notNull(),
  },
  (table) => [index('mail_messages_received_index').on(table.receivedAt)],
);

/** Small key/value settings of the workspace. */
export const appSettings = sqliteTable('app_settings', {
  key: text('key').primaryKey(),
  value: text('value').notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** A problem as stored with its batch: spec 8.17's fields plus the cell reference. */
export interface StoredProblem {
  sheet: string | null;
  row: number | null;
  column: string | null;
  value: string | number | boolean | null;
  message: string;
  cell?: string;
  /** Warning kind (spec 8.16); absent for errors. */
  kind?: string;
}

/** Import statuses; the same list as `IMPORT_STATUSES` in `@keelson/contracts`. */
export const IMPORT_STATUS_VALUES = ['needs_mapping', 'rejected', 'ready', 'committed'] as const;

/** Saved column mappings, offered again for files with the same headers. */
export const importMappings = sqliteTable(
  'import_mappings',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    name: text('name').notNull(),
    /** SHA-256 (hex) of the file's sheet names and header rows. */
    headerSignature: text('header_signature').notNull(),
    /** A `WorkbookMapping` as JSON. */
    mapping: text('mapping', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    lastUsedAt: text('last_used_at'),
  },
  (table) => [
    uniqueIndex('import_mappings_name_unique').on(table.name),
    index('import_mappings_signature_index').on(table.headerSignature),
  ],
);

/** Every upload, kept even when rejected: who, when, what file, and every problem found. */
export const importBatches = sqliteTable(
  'import_batches',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    status: text('status', { enum: IMPORT_STATUS_VALUES }).notNull(),
    fileName: text('file_name').notNull(),
    fileSize: integer('file_size').notNull(),
    /** SHA-256 (hex) of the uploaded bytes. */
    sha256: text('sha256').notNull(),
    /** Told by content; null when the file is not a spreadsheet at all. */
    format: text('format', { enum: ['xlsx', 'csv', 'zip'] }),
    headerSignature: text('header_signature'),
    /** The mapping of the last check (a `WorkbookMapping`), or null for the template's names. */
    mapping: text('mapping', { mode: 'json' }).$type<Record<string, unknown>>(),
    mappingId: integer('mapping_id').references(() => importMappings.id, {
      onDelete: 'set null',
    }),
    /** `[{name, rowCount}]` of every sheet of the file. */
    sheets: text('sheets', { mode: 'json' })
      .$type<{ name: string; rowCount: number }[]>()
      .notNull(),
    /** Data rows read per template sheet. */
    counts: text('counts', { mode: 'json' }).$type<Record<string, number>>().notNull(),
    errors: text('errors', { mode: 'json' }).$type<StoredProblem[]>().notNull(),
    warnings: text('warnings', { mode: 'json' }).$type<StoredProblem[]>().notNull(),
    errorCount: integer('error_count').notNull(),
    warningCount: integer('warning_count').notNull(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    committedAt: text('committed_at'),
  },
  (table) => [
    index('import_batches_created_index').on(table.createdAt),
    index('import_batches_sha_index').on(table.sha256),
    check(
      'import_batches_status_known',
      sql`${table.status} in ('needs_mapping', 'rejected', 'ready', 'committed')`,
    ),
  ],
);

/** The uploaded bytes of a batch, kept so it can be mapped, checked again and committed. */
export const importFiles = sqliteTable('import_files', {
  batchId: integer('batch_id')
    .primaryKey()
    .references(() => importBatches.id, { onDelete: 'cascade' }),
  data: blob('data', { mode: 'buffer' }).notNull(),
});

/** A committed network: every row below belongs to exactly one version and never changes. */
export const networkVersions = sqliteTable(
  'network_versions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    label: text('label').notNull(),
    importBatchId: integer('import_batch_id')
      .notNull()
      .references(() => importBatches.id),
    previousVersionId: integer('previous_version_id'),
    /** `NetworkVersionDto['counts']` as JSON. */
    counts: text('counts', { mode: 'json' }).$type<Record<string, number>>().notNull(),
    /** `NetworkChangesDto` against the previous version, as JSON. */
    changes: text('changes', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
  },
  (table) => [uniqueIndex('network_versions_batch_unique').on(table.importBatchId)],
);

const versionRef = () =>
  integer('version_id')
    .notNull()
    .references(() => networkVersions.id, { onDelete: 'cascade' });
/** Extra columns of a spreadsheet row, by header. */
const attributesColumn = () =>
  text('attributes', { mode: 'json' }).$type<Record<string, string>>();

/** Plants of a network version (sheet Plants). */
export const networkPlants = sqliteTable(
  'network_plants',
  {
    versionId: versionRef(),
    code: text('code').notNull(),
    name: text('name').notNull(),
    country: text('country').notNull(),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [primaryKey({ columns: [table.versionId, table.code] })],
);

/** Products of a network version (sheet Products). */
export const networkProducts = sqliteTable(
  'network_products',
  {
    versionId: versionRef(),
    code: text('code').notNull(),
    plantCode: text('plant_code').notNull(),
    name: text('name').notNull(),
    weeklyRevenue: real('weekly_revenue').notNull(),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [
    primaryKey({ columns: [table.versionId, table.code] }),
    index('network_products_plant_index').on(table.versionId, table.plantCode),
  ],
);

/**
 * Items of a network version, derived at commit: one row per (item, holder), where the holder is
 * the plant that makes or buys it or the supplier that buys it (spec section 2's item nodes).
 */
export const networkItems = sqliteTable(
  'network_items',
  {
    versionId: versionRef(),
    code: text('code').notNull(),
    holderCode: text('holder_code').notNull(),
    holderKind: text('holder_kind', { enum: ['plant', 'supplier'] }).notNull(),
    kind: text('kind', { enum: ['made', 'bought'] }).notNull(),
    qualifiedSources: integer('qualified_sources').notNull(),
    usedIn: integer('used_in').notNull(),
    weeksOfCover: real('weeks_of_cover'),
  },
  (table) => [
    primaryKey({ columns: [table.versionId, table.holderCode, table.code] }),
    index('network_items_code_index').on(table.versionId, table.code),
  ],
);

/** BOM lines of a network version (sheet BOM). */
export const networkBomLines = sqliteTable(
  'network_bom_lines',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    versionId: versionRef(),
    parentCode: text('parent_code').notNull(),
    childCode: text('child_code').notNull(),
    qtyPer: real('qty_per').notNull(),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [
    index('network_bom_parent_index').on(table.versionId, table.parentCode),
    index('network_bom_child_index').on(table.versionId, table.childCode),
  ],
);

/** Suppliers of a network version (sheet Suppliers), with the tier computed at commit. */
export const networkSuppliers = sqliteTable(
  'network_suppliers',
  {
    versionId: versionRef(),
    code: text('code').notNull(),
    name: text('name').notNull(),
    country: text('country').notNull(),
    region: text('region').notNull(),
    recoveryWeeks: real('recovery_weeks').notNull(),
    financialHealth: integer('financial_health'),
    deliveryScore: integer('delivery_score'),
    hasContinuityPlan: integer('has_continuity_plan', { mode: 'boolean' }),
    /** Spec section 2's tier; null when the supplier reaches no plant. */
    tier: integer('tier'),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [
    primaryKey({ columns: [table.versionId, table.code] }),
    index('network_suppliers_country_index').on(table.versionId, table.country),
    index('network_suppliers_tier_index').on(table.versionId, table.tier),
    index('network_suppliers_name_index').on(table.versionId, table.name),
  ],
);

/** Which plants each supplier serves, directly or through other suppliers (derived at commit). */
export const networkSupplierPlants = sqliteTable(
  'network_supplier_plants',
  {
    versionId: versionRef(),
    supplierCode: text('supplier_code').notNull(),
    plantCode: text('plant_code').notNull(),
  },
  (table) => [
    primaryKey({ columns: [table.versionId, table.supplierCode, table.plantCode] }),
    index('network_supplier_plants_plant_index').on(table.versionId, table.plantCode),
  ],
);

/** Sourcing rows of a network version (sheet Sourcing). */
export const networkSourcing = sqliteTable(
  'network_sourcing',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    versionId: versionRef(),
    buyerCode: text('buyer_code').notNull(),
    itemCode: text('item_code').notNull(),
    supplierCode: text('supplier_code').notNull(),
    sharePct: real('share_pct'),
    isQualified: integer('is_qualified', { mode: 'boolean' }).notNull(),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [
    index('network_sourcing_supplier_index').on(
      table.versionId,
      table.supplierCode,
      table.buyerCode,
    ),
    index('network_sourcing_buyer_index').on(table.versionId, table.buyerCode, table.itemCode),
  ],
);

/** Stock rows of a network version (sheet Stock). */
export const networkStock = sqliteTable(
  'network_stock',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    versionId: versionRef(),
    plantCode: text('plant_code').notNull(),
    itemCode: text('item_code').notNull(),
    weeksOfCover: real('weeks_of_cover').notNull(),
    row: integer('row'),
    attributes: attributesColumn(),
  },
  (table) => [index('network_stock_item_index').on(table.versionId, table.plantCode, table.itemCode)],
);

/** Countries and their hazard rating (1 low - 5 high); admins edit them. */
export const countries = sqliteTable(
  'countries',
  {
    /** ISO 3166-1 alpha-2. */
    code: text('code').primaryKey(),
    name: text('name').notNull(),
    region: text('region').notNull(),
    hazard: integer('hazard').notNull(),
    /** True while the rating is the shipped, invented default. */
    isDefault: integer('is_default', { mode: 'boolean' }).notNull().default(true),
    updatedAt: text('updated_at').notNull(),
    updatedBy: integer('updated_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (table) => [check('countries_hazard_range', sql`${table.hazard} between 1 and 5`)],
);

/** Run statuses; the same list as `RUN_STATUSES` in `@keelson/contracts`. */
export const RUN_STATUS_VALUES = ['queued', 'running', 'succeeded', 'failed', 'cancelled'] as const;

/** Analysis runs: one analysis of one network version, with its progress and outcome. */
export const analysisRuns = sqliteTable(
  'analysis_runs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    networkVersionId: integer('network_version_id')
      .notNull()
      .references(() => networkVersions.id),
    label: text('label').notNull(),
    /** `manual` (a risk manager started it) or `quarterly` (the re-scoring job). */
    kind: text('kind', { enum: ['manual', 'quarterly'] }).notNull().default('manual'),
    status: text('status', { enum: RUN_STATUS_VALUES }).notNull(),
    /** 0 - 1. */
    progress: real('progress').notNull().default(0),
    /** The engine's current stage while running. */
    stage: text('stage'),
    error: text('error'),
    /** `AnalysisTotals` of the engine, JSON. */
    totals: text('totals', { mode: 'json' }).$type<Record<string, unknown>>(),
    /** Milliseconds per stage, JSON. */
    timings: text('timings', { mode: 'json' }).$type<Record<string, number>>(),
    /** `methods` of the engine's result (how closeness was computed), JSON. */
    methods: text('methods', { mode: 'json' }).$type<Record<string, unknown>>(),
    /** The scoring settings the run's register scores used, JSON (a `ScoringSettings`). */
    scoringSettings: text('scoring_settings', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    startedAt: text('started_at'),
    finishedAt: text('finished_at'),
  },
  (table) => [
    index('analysis_runs_version_index').on(table.networkVersionId),
    index('analysis_runs_created_index').on(table.createdAt),
    check(
      'analysis_runs_status_known',
      sql`${table.status} in ('queued', 'running', 'succeeded', 'failed', 'cancelled')`,
    ),
  ],
);

/**
 * One supplier's result in a run: every field of spec section 6 plus tier, nexus index and the
 * register score. Written once when the run succeeds, in one transaction; never changed.
 */
export const runSuppliers = sqliteTable(
  'run_suppliers',
  {
    runId: integer('run_id')
      .notNull()
      .references(() => analysisRuns.id, { onDelete: 'cascade' }),
    code: text('code').notNull(),
    name: text('name').notNull(),
    country: text('country').notNull(),
    region: text('region').notNull(),
    tier: integer('tier'),
    /** Rank by revenue impact, then products lost, then code (1 = first). */
    rank: integer('rank').notNull(),
    /** Product codes, JSON array, sorted. */
    productsLost: text('products_lost', { mode: 'json' }).$type<string[]>().notNull(),
    productsLostCount: integer('products_lost_count').notNull(),
    /** Plants of the lost products, JSON array, sorted. */
    plants: text('plants', { mode: 'json' }).$type<string[]>().notNull(),
    revenueExposedPerWeek: real('revenue_exposed_per_week').notNull(),
    revenueImpact: real('revenue_impact').notNull(),
    timeToRecover: real('time_to_recover').notNull(),
    singlePointOfFailure: integer('single_point_of_failure', { mode: 'boolean' }).notNull(),
    betweenness: real('betweenness').notNull(),
    degree: real('degree').notNull(),
    closeness: real('closeness').notNull(),
    eigenvector: real('eigenvector').notNull(),
    pagerank: real('pagerank').notNull(),
    nexusIndex: real('nexus_index').notNull(),
    /** Time to survive and lost weeks per lost product (`ProductImpact[]`), JSON. */
    products: text('products', { mode: 'json' }).$type<Record<string, unknown>[]>().notNull(),
    /** Likelihood 1-5 as computed from the supplier's data (before any override). */
    likelihood: integer('likelihood').notNull(),
    /** The factor risks behind it (`LikelihoodResult['factors']`), JSON. */
    likelihoodFactors: text('likelihood_factors', { mode: 'json' })
      .$type<Record<string, number>>()
      .notNull(),
    impactBand: integer('impact_band').notNull(),
    rating: integer('rating').notNull(),
    ratingBand: text('rating_band', { enum: ['low', 'medium', 'high', 'critical'] }).notNull(),
  },
  (table) => [
    primaryKey({ columns: [table.runId, table.code] }),
    index('run_suppliers_rank_index').on(table.runId, table.rank),
    index('run_suppliers_code_index').on(table.code, table.runId),
  ],
);

/** Which plants each run result touches (lost products' plants), for plant-scoped reading. */
export const runSupplierPlants = sqliteTable(
  'run_supplier_plants',
  {
    runId: integer('run_id')
      .notNull()
      .references(() => analysisRuns.id, { onDelete: 'cascade' }),
    code: text('code').notNull(),
    plantCode: text('plant_code').notNull(),
  },
  (table) => [
    primaryKey({ columns: [table.runId, table.code, table.plantCode] }),
    index('run_supplier_plants_plant_index').on(table.runId, table.plantCode),
  ],
);

/** Saved failure sets, to rerun on later network versions. */
export const scenarios = sqliteTable(
  'scenarios',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    name: text('name').notNull(),
    description: text('description'),
    /** Supplier codes, countries and regions that fail together, JSON arrays. */
    suppliers: text('suppliers', { mode: 'json' }).$type<string[]>().notNull(),
    countries: text('countries', { mode: 'json' }).$type<string[]>().notNull(),
    regions: text('regions', { mode: 'json' }).$type<string[]>().notNull(),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
  },
  (table) => [uniqueIndex('scenarios_name_unique').on(table.name)],
);

/** Register entry statuses; the same list as `REGISTER_STATUSES` in `@keelson/contracts`. */
export const REGISTER_STATUS_VALUES = ['open', 'mitigating', 'accepted', 'closed'] as const;

/** The risk register: one entry per supplier risk. */
export const registerEntries = sqliteTable(
  'register_entries',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    supplierCode: text('supplier_code').notNull(),
    title: text('title').notNull(),
    /** `automatic` (a run created it) or `manual`. */
    origin: text('origin', { enum: ['automatic', 'manual'] }).notNull(),
    status: text('status', { enum: REGISTER_STATUS_VALUES }).notNull().default('open'),
    ownerId: integer('owner_id').references(() => users.id, { onDelete: 'set null' }),
    /** The run whose results the entry's scores come from. */
    runId: integer('run_id').references(() => analysisRuns.id, { onDelete: 'set null' }),
    computedLikelihood: integer('computed_likelihood').notNull(),
    /** A risk manager's likelihood, with the reason kept in `likelihood_overrides`. */
    likelihoodOverride: integer('likelihood_override'),
    impactBand: integer('impact_band').notNull(),
    /** impact band x (override ?? computed likelihood). */
    rating: integer('rating').notNull(),
    ratingBand: text('rating_band', { enum: ['low', 'medium', 'high', 'critical'] }).notNull(),
    notes: text('notes').notNull().default(''),
    /**
     * Set by a re-scoring: `supplier_removed` (not in the network any more) or
     * `no_longer_matters` (no longer a single point of failure and rated low); null otherwise.
     * People decide what to do with a flagged entry.
     */
    flag: text('flag', { enum: ['supplier_removed', 'no_longer_matters'] }),
    createdBy: integer('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
  },
  (table) => [
    index('register_entries_supplier_index').on(table.supplierCode),
    index('register_entries_rating_index').on(table.rating),
    check(
      'register_entries_status_known',
      sql`${table.status} in ('open', 'mitigating', 'accepted', 'closed')`,
    ),
    check(
      'register_entries_override_range',
      sql`${table.likelihoodOverride} is null or ${table.likelihoodOverride} between 1 and 5`,
    ),
  ],
);

/** Plants an entry affects (for plant managers' scope). */
export const registerEntryPlants = sqliteTable(
  'register_entry_plants',
  {
    entryId: integer('entry_id')
      .notNull()
      .references(() => registerEntries.id, { onDelete: 'cascade' }),
    plantCode: text('plant_code').notNull(),
  },
  (table) => [
    primaryKey({ columns: [table.entryId, table.plantCode] }),
    index('register_entry_plants_plant_index').on(table.plantCode),
  ],
);

/** Every likelihood override of an entry, kept: who, when, from what, to what, and why. */
export const likelihoodOverrides = sqliteTable(
  'likelihood_overrides',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    entryId: integer('entry_id')
      .notNull()
      .references(() => registerEntries.id, { onDelete: 'cascade' }),
    /** The new likelihood 1-5, or null when the override was removed (back to computed). */
    likelihood: integer('likelihood'),
    previous: integer('previous'),
    reason: text('reason').notNull(),
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
  },
  (table) => [index('likelihood_overrides_entry_index').on(table.entryId)],
);

/** Mitigation strategies; the same list as `PLAN_STRATEGIES` in `@keelson/contracts`. */
export const PLAN_STRATEGY_VALUES = ['second_source', 'safety_stock', 'qualify_alternate',
  'contract_terms', 'accept', 'other'] as const;
/** Plan statuses; the same list as `PLAN_STATUSES` in `@keelson/contracts`. */
export const PLAN_STATUS_VALUES = ['draft', 'submitted', 'approved', 'rejected', 'in_progress',
  'done', 'withdrawn'] as const;
/** Task statuses; the same list as `TASK_STATUSES` in `@keelson/contracts`. */
export const TASK_STATUS_VALUES = ['todo', 'doing', 'done', 'cancelled'] as const;

/** Mitigation plans: what is done about a register entry, and its approval. */
export const mitigationPlans = sqliteTable(
  'mitigation_plans',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    entryId: integer('entry_id')
      .notNull()
      .references(() => registerEntries.id, { onDelete: 'cascade' }),
    strategy: text('strategy', { enum: PLAN_STRATEGY_VALUES }).notNull(),
    description: text('description').notNull(),
    estimatedCost: real('estimated_cost'),
    targetDate: text('target_date'),
    status: text('status', { enum: PLAN_STATUS_VALUES }).notNull().default('draft'),
    /** Proposed network changes for the what-if (`PlanChange[]`), JSON. */
    changes: text('changes', { mode: 'json' }).$type<Record<string, unknown>[]>().notNull(),
    /** The what-if's before and after (`WhatIfResultDto`), JSON; null until run. */
    whatIf: text('what_if', { mode: 'json' }).$type<Record<string, unknown>>(),
    /** The comment of the last rejection, shown on the draft. */
    rejectionComment: text('rejection_comment'),
    authorId: integer('author_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
    submittedAt: text('submitted_at'),
    decidedAt: text('decided_at'),
  },
  (table) => [
    index('mitigation_plans_entry_index').on(table.entryId),
    index('mitigation_plans_status_index').on(table.status),
  ],
);

/** One plant manager's decision on a submitted plan, per plant the risk touches. */
export const planDecisions = sqliteTable(
  'plan_decisions',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    planId: integer('plan_id')
      .notNull()
      .references(() => mitigationPlans.id, { onDelete: 'cascade' }),
    plantCode: text('plant_code').notNull(),
    decision: text('decision', { enum: ['approved', 'rejected'] }).notNull(),
    comment: text('comment').notNull().default(''),
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    /** The submission the decision belongs to (a plan can be resubmitted after a rejection). */
    submittedAt: text('submitted_at').notNull(),
    createdAt: text('created_at').notNull(),
  },
  (table) => [
    uniqueIndex('plan_decisions_once_per_plant').on(table.planId, table.submittedAt,
      table.plantCode),
  ],
);

/** Tasks of a plan. */
export const planTasks = sqliteTable(
  'plan_tasks',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    planId: integer('plan_id')
      .notNull()
      .references(() => mitigationPlans.id, { onDelete: 'cascade' }),
    title: text('title').notNull(),
    ownerId: integer('owner_id').references(() => users.id, { onDelete: 'set null' }),
    dueDate: text('due_date'),
    status: text('status', { enum: TASK_STATUS_VALUES }).notNull().default('todo'),
    createdAt: text('created_at').notNull(),
    updatedAt: text('updated_at').notNull(),
  },
  (table) => [
    index('plan_tasks_plan_index').on(table.planId),
    index('plan_tasks_owner_index').on(table.ownerId, table.status),
  ],
);

/** Comments on a task. */
export const taskComments = sqliteTable(
  'task_comments',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    taskId: integer('task_id')
      .notNull()
      .references(() => planTasks.id, { onDelete: 'cascade' }),
    userId: integer('user_id').references(() => users.id, { onDelete: 'set null' }),
    text: text('text').notNull(),
    createdAt: text('created_at').notNull(),
  },
  (table) => [index('task_comments_task_index').on(table.taskId)],
);

/**
 * The audit trail: one row per change that matters (imports, runs, overrides, register edits,
 * plan submissions and decisions, task changes, user and role changes). Append-only: no route
 * updates or deletes a row (triggers in the migration refuse it).
 */
export const auditEvents = sqliteTable(
  'audit_events',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    /** e.g. `import.committed`, `run.succeeded`, `register.likelihood_overridden`. */
    action: text('action').notNull(),
    /** The kind and id of what changed: `register_entry` 12, `plan` 3, `user` 7 ... */
    subjectType: text('subject_type').notNull(),
    subjectId: text('subject_id').notNull(),
    // No ON DELETE action: audit rows never change, so a user with a trail is deactivated,
    // never deleted.
    userId: integer('user_id').references(() => users.id),
    /** JSON snapshots of what changed, before and after (null when not applicable). */
    before: text('before', { mode: 'json' }).$type<Record<string, unknown>>(),
    after: text('after', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdAt: text('created_at').notNull(),
  },
  (table) => [
    index('audit_events_subject_index').on(table.subjectType, table.subjectId),
    index('audit_events_created_index').on(table.createdAt),
  ],
);

/** Statuses of a quarterly re-scoring; the same list as `RESCORING_STATUSES` in contracts. */
export const RESCORING_STATUS_VALUES = ['queued', 'running', 'succeeded', 'failed',
  'interrupted', 'cancelled'] as const;

/**
 * Quarterly re-scoring runs: the whole supply base re-analysed against a network version and
 * the register re-scored with it, once per quarter label. The partial unique index is the
 * quarter's lock: at most one unforced re-scoring per label that is queued, running,
 * interrupted or succeeded, so two clicks, or a click during the scheduled run, never make two.
 */
export const rescoringRuns = sqliteTable(
  'rescoring_runs',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    /** `2027-Q1`: the calendar quarter, in the schedule's time zone. */
    quarterLabel: text('quarter_label').notNull(),
    networkVersionId: integer('network_version_id')
      .notNull()
      .references(() => networkVersions.id),
    /** The analysis run of the current attempt (a resumed re-scoring gets a new one). */
    analysisRunId: integer('analysis_run_id').references(() => analysisRuns.id,
      { onDelete: 'set null' }),
    status: text('status', { enum: RESCORING_STATUS_VALUES }).notNull(),
    /** `schedule` (the quarterly timetable) or `manual` (Start re-scoring). */
    trigger: text('trigger', { enum: ['schedule', 'manual'] }).notNull(),
    /** An admin's second re-scoring of a quarter that already has one (outside the lock). */
    isForced: integer('is_forced', { mode: 'boolean' }).notNull().default(false),
    attempts: integer('attempts').notNull().default(1),
    /** What changed (`RescoringSummaryDto`), JSON; null until it succeeds. */
    summary: text('summary', { mode: 'json' }).$type<Record<string, unknown>>(),
    error: text('error'),
    startedBy: integer('started_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: text('created_at').notNull(),
    startedAt: text('started_at'),
    finishedAt: text('finished_at'),
  },
  (table) => [
    uniqueIndex('rescoring_runs_quarter_lock').on(table.quarterLabel)
      .where(sql`is_forced = 0 and status in ('queued', 'running', 'interrupted', 'succeeded')`),
    index('rescoring_runs_created_index').on(table.createdAt),
  ],
);

/**
 * A register entry's score at each re-scoring: the history the quarter comparison, the trends
 * and the owners' e-mails read. Written in the re-scoring's own transaction.
 */
export const registerEntryScores = sqliteTable(
  'register_entry_scores',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    entryId: integer('entry_id')
      .notNull()
      .references(() => registerEntries.id, { onDelete: 'cascade' }),
    rescoringRunId: integer('rescoring_run_id')
      .notNull()
      .references(() => rescoringRuns.id, { onDelete: 'cascade' }),
    likelihood: integer('likelihood').notNull(),
    impactBand: integer('impact_band').notNull(),
    rating: integer('rating').notNull(),
    ratingBand: text('rating_band', { enum: ['low', 'medium', 'high', 'critical'] }).notNull(),
    /** The rating before this re-scoring; null for an entry it created. */
    previousRating: integer('previous_rating'),
    previousRatingBand: text('previous_rating_band',
      { enum: ['low', 'medium', 'high', 'critical'] }),
    revenueImpact: real('revenue_impact'),
    /** `supplier_removed`, `no_longer_matters` or null: see `register_entries.flag`. */
    flag: text('flag', { enum: ['supplier_removed', 'no_longer_matters'] }),
    createdAt: text('created_at').notNull(),
  },
  (table) => [
    uniqueIndex('register_entry_scores_once').on(table.rescoringRunId, table.entryId),
    index('register_entry_scores_entry_index').on(table.entryId),
  ],
);

/** Per-user e-mail preferences (unsubscribe from each kind of message). */
export const mailPreferences = sqliteTable('mail_preferences', {
  userId: integer('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  /** Kinds the user does not want (`plan_submitted`, `plan_decided`, `task_assigned`, `digest`). */
  unsubscribed: text('unsubscribed', { mode: 'json' }).$type<string[]>().notNull(),
  updatedAt: text('updated_at').notNull(),
});

/** Where an e-mail of the outbox stands: waiting (to be tried again), accepted, given up. */
export const MAIL_OUTBOX_STATUSES = ['pending', 'sent', 'failed'] as const;

/**
 * Every notification e-mail, written before it is sent so none is lost: a message the SMTP
 * server did not take is tried again later, and one left waiting when the server stopped goes
 * out on the next start. A re-scoring writes its messages in the run's own transaction.
 */
export const mailOutbox = sqliteTable(
  'mail_outbox',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    /** The kind of message (`plan_submitted`, `digest`, `rescoring`, ...). */
    kind: text('kind').notNull(),
    /** JSON array of recipient addresses. */
    toAddresses: text('to_addresses', { mode: 'json' }).$type<string[]>().notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html').notNull(),
    status: text('status', { enum: MAIL_OUTBOX_STATUSES }).notNull().default('pending'),
    /** Tries so far. */
    attempts: integer('attempts').notNull().default(0),
    /** When a pending message is tried next. */
    nextAttemptAt: text('next_attempt_at').notNull(),
    /** The SMTP error of the last failed try. */
    lastError: text('last_error'),
    createdAt: text('created_at').notNull(),
    sentAt: text('sent_at'),
  },
  (table) => [
    index('mail_outbox_due_index').on(table.status, table.nextAttemptAt),
    check('mail_outbox_status_check',
      sql`${table.status} in ('pending', 'sent', 'failed')`),
  ],
);

/** A row of `users`. */
export type UserRow = typeof users.$inferSelect;
/** A new row of `users`. */
export type NewUserRow = typeof users.$inferInsert;
/** A row of `plants`. */
export type PlantRow = typeof plants.$inferSelect;
/** A row of `invitations`. */
export type InvitationRow = typeof invitations.$inferSelect;
/** A row of `mail_messages`. */
export type MailMessageRow = typeof mailMessages.$inferSelect;
/** A new row of `mail_messages`. */
export type NewMailMessageRow = typeof mailMessages.$inferInsert;
/** A row of `mail_outbox`. */
export type MailOutboxRow = typeof mailOutbox.$inferSelect;
/** A row of `import_batches`. */
export type ImportBatchRow = typeof importBatches.$inferSelect;
/** A row of `network_versions`. */
export type NetworkVersionRow = typeof networkVersions.$inferSelect;
/** A row of `network_suppliers`. */
export type NetworkSupplierRow = typeof networkSuppliers.$inferSelect;
/** A row of `countries`. */
export type CountryRow = typeof countries.$inferSelect;
/** A row of `analysis_runs`. */
export type AnalysisRunRow = typeof analysisRuns.$inferSelect;
/** A row of `run_suppliers`. */
export type RunSupplierRow = typeof runSuppliers.$inferSelect;
/** A row of `register_entries`. */
export type RegisterEntryRow = typeof registerEntries.$inferSelect;
