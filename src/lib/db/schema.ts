/**
 * Database schema. The first block is the tables better-auth needs (users, sessions,
 * accounts, verification tokens, organizations = workspaces, members, invitations);
 * the rest are Varledger's workspace tables, each carrying the organization id.
 * Migrations are generated from this file by drizzle-kit into drizzle/ (never hand-edited).
 */
import { sqliteTable, text, integer, real, blob, index, uniqueIndex, primaryKey } from 'drizzle-orm/sqlite-core';
import { sql } from 'drizzle-orm';

const createdAt = () => integer('created_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch() * 1000)`);
const updatedAt = () => integer('updated_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch() * 1000)`);

export const user = sqliteTable('user', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  email: text('email').notNull().unique(),
  emailVerified: integer('email_verified', { mode: 'boolean' }).notNull().default(false),
  image: text('image'),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const session = sqliteTable(
  'session',
  {
    id: text('id').primaryKey(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    token: text('token').notNull().unique(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    ipAddress: text('ip_address'),
    userAgent: text('user_agent'),
    userId: text('user_id').notNull().references(() => user.id, { onDelete: 'cascade' }),
    activeOrganizationId: text('active_organization_id'),
  },
  (t) => [index('session_user_idx').on(t.userId)],
);

export const account = sqliteTable(
  'account',
  {
    id: text('id').primaryKey(),
    accountId: text('account_id').notNull(),
    providerId: text('provider_id').notNull(),
    userId: text('user_id').notNull().references(() => user.id, { onDelete: 'cascade' }),
    accessToken: text('access_token'),
    refreshToken: text('refresh_token'),
    idToken: text('id_token'),
    accessTokenExpiresAt: integer('access_token_expires_at', { mode: 'timestamp_ms' }),
    refreshTokenExpiresAt: integer('refresh_token_expires_at', { mode: 'timestamp_ms' }),
    scope: text('scope'),
    password: text('password'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('account_user_idx').on(t.userId)],
);

export const verification = sqliteTable(
  'verification',
  {
    id: text('id').primaryKey(),
    identifier: text('identifier').notNull(),
    value: text('value').notNull(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('verification_identifier_idx').on(t.identifier)],
);

/** A workspace: one company's sites, or one consultant's client. */
export const organization = sqliteTable('organization', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  logo: text('logo'),
  createdAt: createdAt(),
  metadata: text('metadata'),
});

export const member = sqliteTable(
  'member',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    userId: text('user_id').notNull().references(() => user.id, { onDelete: 'cascade' }),
    role: text('role').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('member_org_user_idx').on(t.organizationId, t.userId), index('member_user_idx').on(t.userId)],
);

export const invitation = sqliteTable(
  'invitation',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: text('role'),
    status: text('status').notNull().default('pending'),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    createdAt: createdAt(),
    inviterId: text('inviter_id').notNull().references(() => user.id, { onDelete: 'cascade' }),
  },
  (t) => [index('invitation_org_idx').on(t.organizationId), index('invitation_email_idx').on(t.email)],
);

/** A metered site (one supply point, one tariff). */
export const site = sqliteTable(
  'site',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    address: text('address').notNull().default(''),
    timeZone: text('time_zone').notNull(),
    utility: text('utility').notNull().default(''),
    accountNumber: text('account_number').notNull().default(''),
    serviceVoltageV: real('service_voltage_v'),
    transformerKva: real('transformer_kva'),
    transformerImpedancePct: real('transformer_impedance_pct'),
    currency: text('currency').notNull().default('USD'),
    auditState: text('audit_state', { enum: ['draft', 'audited', 'reported'] }).notNull().default('draft'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('site_org_idx').on(t.organizationId), uniqueIndex('site_org_name_idx').on(t.organizationId, t.name)],
);

/** Who did what in a workspace: tariff edits, imports, purchases, reports, membership. */
export const auditEvent = sqliteTable(
  'audit_event',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    actorUserId: text('actor_user_id'),
    action: text('action').notNull(),
    subjectType: text('subject_type').notNull(),
    subjectId: text('subject_id'),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdAt: createdAt(),
  },
  (t) => [index('audit_event_org_idx').on(t.organizationId, t.createdAt)],
);

export const authSchema = { user, session, account, verification, organization, member, invitation };

/** A meter at a site (one supply point may have several, e.g. main and sub-meters). */
export const meter = sqliteTable(
  'meter',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    intervalMinutes: integer('interval_minutes'),
    reactiveSource: text('reactive_source', { enum: ['registers', 'net', 'none'] }),
    /** The last confirmed column mapping, offered for the next import of this meter. */
    importProfile: text('import_profile', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('meter_site_name_idx').on(t.siteId, t.name), index('meter_org_idx').on(t.organizationId)],
);

/** A file kept in the content-addressed store (DATA_DIR/files/<sha256>), per workspace. */
export const storedFile = sqliteTable(
  'stored_file',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').references(() => site.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: ['meter-data', 'bill-document', 'bill-history'] }).notNull(),
    sha256: text('sha256').notNull(),
    fileName: text('file_name').notNull(),
    contentType: text('content_type').notNull(),
    bytes: integer('bytes').notNull(),
    createdBy: text('created_by'),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('stored_file_site_kind_sha_idx').on(t.siteId, t.kind, t.sha256), index('stored_file_org_idx').on(t.organizationId)],
);

/** One meter-data upload: its mapping, outcome, data-quality report and problems. */
export const meterImport = sqliteTable(
  'meter_import',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    fileId: text('file_id').notNull().references(() => storedFile.id, { onDelete: 'cascade' }),
    status: text('status', { enum: ['processing', 'imported', 'rejected', 'interrupted'] }).notNull(),
    mapping: text('mapping', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    quality: text('quality', { mode: 'json' }).$type<Record<string, unknown>>(),
    problems: text('problems', { mode: 'json' }).$type<unknown[]>(),
    totalProblems: integer('total_problems').notNull().default(0),
    bytesTotal: integer('bytes_total').notNull().default(0),
    bytesProcessed: integer('bytes_processed').notNull().default(0),
    rowsProcessed: integer('rows_processed').notNull().default(0),
    intervals: integer('intervals').notNull().default(0),
    firstStartMs: integer('first_start_ms'),
    lastStartMs: integer('last_start_ms'),
    replaced: integer('replaced', { mode: 'boolean' }).notNull().default(false),
    createdBy: text('created_by'),
    createdAt: createdAt(),
    finishedAt: integer('finished_at', { mode: 'timestamp_ms' }),
  },
  (t) => [index('meter_import_site_idx').on(t.siteId, t.createdAt), index('meter_import_org_idx').on(t.organizationId)],
);

/**
 * Interval data, packed: one row per meter and UTC day holding that day's intervals as
 * little-endian typed-array blobs (Float64 start ms, kWh, kvarh lagging, kvarh leading;
 * Uint8 flags). See DEVELOPERS.md, Decisions: reading a site-year is 365 rows, not 35,040+.
 */
export const intervalBlock = sqliteTable(
  'interval_block',
  {
    meterId: text('meter_id').notNull().references(() => meter.id, { onDelete: 'cascade' }),
    day: integer('day').notNull(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    importId: text('import_id').notNull(),
    intervalMinutes: integer('interval_minutes').notNull(),
    count: integer('count').notNull(),
    startMs: blob('start_ms', { mode: 'buffer' }).notNull(),
    kwh: blob('kwh', { mode: 'buffer' }).notNull(),
    kvarhLag: blob('kvarh_lag', { mode: 'buffer' }).notNull(),
    kvarhLead: blob('kvarh_lead', { mode: 'buffer' }).notNull(),
    flags: blob('flags', { mode: 'buffer' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.meterId, t.day] }), index('interval_block_org_idx').on(t.organizationId)],
);

/** A version of a site's tariff: the engine's tariff object, in force from a date. */
export const tariff = sqliteTable(
  'tariff',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** First local date (YYYY-MM-DD) the version applies to. */
    effectiveFrom: text('effective_from').notNull(),
    definition: text('definition', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    createdBy: text('created_by'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [uniqueIndex('tariff_site_from_idx').on(t.siteId, t.effectiveFrom), index('tariff_org_idx').on(t.organizationId)],
);

/** A utility bill's billed determinants for one billing period (dates are local, end inclusive). */
export const bill = sqliteTable(
  'bill',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    periodStart: text('period_start').notNull(),
    periodEnd: text('period_end').notNull(),
    kwh: real('kwh').notNull(),
    billedDemand: real('billed_demand'),
    demandUnit: text('demand_unit', { enum: ['kW', 'kVA'] }).notNull().default('kW'),
    kvarh: real('kvarh'),
    pf: real('pf'),
    pfCharge: real('pf_charge'),
    total: real('total'),
    currency: text('currency').notNull(),
    documentFileId: text('document_file_id').references(() => storedFile.id, { onDelete: 'set null' }),
    source: text('source', { enum: ['form', 'csv'] }).notNull(),
    createdBy: text('created_by'),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('bill_site_period_idx').on(t.siteId, t.periodStart, t.periodEnd), index('bill_org_idx').on(t.organizationId)],
);

/** A saved correction plan for a site: the bank, its costs and finance inputs, and its last evaluation. */
export const correctionPlan = sqliteTable(
  'correction_plan',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** The plan as entered (bank, costs, finance); validated by the plan schema. */
    spec: text('spec', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    /** Headline figures of the last evaluation (annual saving, capex, payback, NPV, IRR...). */
    summary: text('summary', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdBy: text('created_by'),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('correction_plan_site_idx').on(t.siteId), index('correction_plan_org_idx').on(t.organizationId), uniqueIndex('correction_plan_site_name_idx').on(t.siteId, t.name)],
);

/** An issued Savings report: a frozen snapshot of the figures it showed. */
export const savingsReport = sqliteTable(
  'savings_report',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    siteId: text('site_id').notNull().references(() => site.id, { onDelete: 'cascade' }),
    planId: text('plan_id').references(() => correctionPlan.id, { onDelete: 'set null' }),
    title: text('title').notNull(),
    snapshot: text('snapshot', { mode: 'json' }).$type<Record<string, unknown>>().notNull(),
    issuedBy: text('issued_by'),
    issuedAt: integer('issued_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch() * 1000)`),
  },
  (t) => [index('savings_report_site_idx').on(t.siteId), index('savings_report_org_idx').on(t.organizationId)],
);

/** A Site audit purchase: one hosted checkout for one or more sites of a workspace. */
export const purchase = sqliteTable(
  'purchase',
  {
    id: text('id').primaryKey(),
    organizationId: text('organization_id').notNull().references(() => organization.id, { onDelete: 'cascade' }),
    /** The payment provider's checkout session id (cs_...), set once the session exists. */
    checkoutSessionId: text('checkout_session_id').unique(),
    checkoutUrl: text('checkout_url'),
    status: text('status', { enum: ['pending', 'paid', 'cancelled', 'expired'] }).notNull().default('pending'),
    /** Minor units (cents, pence) per Site audit and in total. */
    unitAmount: integer('unit_amount').notNull(),
    amountTotal: integer('amount_total').notNull(),
    /** ISO 4217, upper case. */
    currency: text('currency').notNull(),
    siteIds: text('site_ids', { mode: 'json' }).$type<string[]>().notNull(),
    /** Site names at the time of purchase, for the receipt (sites may be renamed or deleted later). */
    siteNames: text('site_names', { mode: 'json' }).$type<string[]>().notNull(),
    buyerUserId: text('buyer_user_id'),
    buyerEmail: text('buyer_email').notNull(),
    buyerName: text('buyer_name').notNull().default(''),
    receiptNumber: text('receipt_number').unique(),
    paymentIntentId: text('payment_intent_id'),
    createdAt: createdAt(),
    paidAt: integer('paid_at', { mode: 'timestamp_ms' }),
    closedAt: integer('closed_at', { mode: 'timestamp_ms' }),
  },
  (t) => [index('purchase_org_idx').on(t.organizationId, t.createdAt)],
);

/** Every verified payment webhook event, once: the event id makes delivery idempotent. */
export const paymentEvent = sqliteTable(
  'payment_event',
  {
    id: text('id').primaryKey(),
    /** The workspace of the purchase the event concerns; null when no purchase matched. */
    organizationId: text('organization_id').references(() => organization.id, { onDelete: 'cascade' }),
    purchaseId: text('purchase_id').references(() => purchase.id, { onDelete: 'set null' }),
    type: text('type').notNull(),
    outcome: text('outcome').notNull(),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
    receivedAt: integer('received_at', { mode: 'timestamp_ms' }).notNull().default(sql`(unixepoch() * 1000)`),
  },
  (t) => [index('payment_event_org_idx').on(t.organizationId)],
);

/**
 * Mail waiting to be delivered (or delivered): every product e-mail is written here first
 * and sent by the outbox worker, retried with back-off while the SMTP server is down, so a
 * mail is never lost with the process. Bodies are cleared once sent (they may hold links).
 */
export const mailOutbox = sqliteTable(
  'mail_outbox',
  {
    id: text('id').primaryKey(),
    /** The workspace the mail concerns, when there is one (not for sign-up mails). */
    organizationId: text('organization_id').references(() => organization.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: ['verification', 'password-reset', 'invitation', 'receipt', 'report-issued', 'other'] }).notNull(),
    /** What the mail is about, e.g. `invitation` + its id, so a screen can show the delivery state. */
    refType: text('ref_type'),
    refId: text('ref_id'),
    toAddress: text('to_address').notNull(),
    subject: text('subject').notNull(),
    textBody: text('text_body').notNull(),
    htmlBody: text('html_body').notNull(),
    status: text('status', { enum: ['pending', 'sent', 'failed'] }).notNull().default('pending'),
    attempts: integer('attempts').notNull().default(0),
    nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' }).notNull(),
    lastError: text('last_error'),
    messageId: text('message_id'),
    createdAt: createdAt(),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
  },
  (t) => [index('mail_outbox_due_idx').on(t.status, t.nextAttemptAt), index('mail_outbox_ref_idx').on(t.refType, t.refId)],
);
