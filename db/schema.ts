import { sql } from 'drizzle-orm';
import { index, integer, sqliteTable, text, uniqueIndex } from 'drizzle-orm/sqlite-core';

import type { CheckLimitOverrides } from '@/calc/checks';
import type { EngineSpec } from '@/shared/engine';
import type { FitCheckRun, MeasurementData, MeasurementKind } from '@/shared/measurements';
import type { Order, OrderStage } from '@/shared/orders';
import type { ProfileSpec } from '@/shared/profile';
import type { RevisionResults } from '@/shared/sheets';

const createdAt = () =>
  integer('created_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`);
const updatedAt = () =>
  integer('updated_at', { mode: 'timestamp_ms' })
    .notNull()
    .default(sql`(unixepoch('subsec') * 1000)`)
    .$onUpdate(() => new Date());

/** The owning shop; rows go when the shop goes. */
const shopRef = () =>
  text('shop_id')
    .notNull()
    .references(() => shops.id, { onDelete: 'cascade' });
/** The owning job; rows go when the job goes. */
const jobRef = () =>
  text('job_id')
    .notNull()
    .references(() => jobs.id, { onDelete: 'cascade' });

// Sign-in tables, shaped as better-auth's drizzle adapter expects them.

export const users = sqliteTable('users', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  email: text('email').notNull().unique(),
  emailVerified: integer('email_verified', { mode: 'boolean' }).notNull().default(false),
  image: text('image'),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

export const sessions = sqliteTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    token: text('token').notNull().unique(),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    ipAddress: text('ip_address'),
    userAgent: text('user_agent'),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    activeOrganizationId: text('active_shop_id'),
  },
  (t) => [index('sessions_user_idx').on(t.userId)],
);

export const accounts = sqliteTable(
  'accounts',
  {
    id: text('id').primaryKey(),
    accountId: text('account_id').notNull(),
    providerId: text('provider_id').notNull(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
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
  (t) => [index('accounts_user_idx').on(t.userId)],
);

export const verifications = sqliteTable('verifications', {
  id: text('id').primaryKey(),
  identifier: text('identifier').notNull(),
  value: text('value').notNull(),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

/** A repair shop or a grinding shop (better-auth's organization). */
export const shops = sqliteTable('shops', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  slug: text('slug').notNull().unique(),
  logo: text('logo'),
  metadata: text('metadata'),
  kind: text('kind', { enum: ['repair', 'grinding'] })
    .notNull()
    .default('repair'),
  createdAt: createdAt(),
});

/** A person's role in one shop (better-auth's member). */
export const memberships = sqliteTable(
  'memberships',
  {
    id: text('id').primaryKey(),
    organizationId: shopRef(),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role').notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('memberships_shop_user_idx').on(t.organizationId, t.userId)],
);

export const invitations = sqliteTable('invitations', {
  id: text('id').primaryKey(),
  organizationId: shopRef(),
  email: text('email').notNull(),
  role: text('role'),
  status: text('status').notNull().default('pending'),
  teamId: text('team_id'),
  expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
  inviterId: text('inviter_id')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  createdAt: createdAt(),
});

// Lobewright's own records.

export const jobs = sqliteTable(
  'jobs',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    vehicle: text('vehicle').notNull(),
    customerName: text('customer_name').notNull(),
    complaint: text('complaint').notNull().default(''),
    findings: text('findings').notNull().default(''),
    mileage: integer('mileage'),
    status: text('status', {
      enum: ['intake', 'teardown', 'awaiting-cam', 'assembly', 'delivered'],
    })
      .notNull()
      .default('intake'),
    version: integer('version').notNull().default(1),
    /** When the default checklist was written (first read); null until then, so removed items stay removed. */
    checklistSeededAt: integer('checklist_seeded_at', { mode: 'timestamp_ms' }),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  // The list pages newest change first (keyset on updated_at, id); the create cap counts by created_at.
  (t) => [index('jobs_shop_updated_id_idx').on(t.shopId, t.updatedAt, t.id), index('jobs_shop_created_idx').on(t.shopId, t.createdAt)],
);

/** The engine on a job (one per job). `spec` is validated by shared/engine.ts before it is written. */
export const engines = sqliteTable('engines', {
  jobId: text('job_id')
    .primaryKey()
    .references(() => jobs.id, { onDelete: 'cascade' }),
  shopId: shopRef(),
  spec: text('spec', { mode: 'json' }).$type<EngineSpec>().notNull(),
  version: integer('version').notNull().default(1),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});

/** A cam profile: in the shop's library (job_id null) or copied into a job. */
export const camProfiles = sqliteTable(
  'cam_profiles',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: text('job_id').references(() => jobs.id, { onDelete: 'cascade' }),
    sourceProfileId: text('source_profile_id'),
    label: text('label').notNull(),
    coreNotes: text('core_notes').notNull().default(''),
    spec: text('spec', { mode: 'json' }).$type<ProfileSpec>().notNull(),
    version: integer('version').notNull().default(1),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('cam_profiles_shop_job_idx').on(t.shopId, t.jobId)],
);

/** A spec sheet on a job: an ordered list of revisions, the latest of which is current. */
export const specSheets = sqliteTable(
  'spec_sheets',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    /**
     * The job's profile (the option) this sheet grinds: one sheet per option. Null only when that profile
     * was removed from the job, or an older sheet could not be matched to one; the sheet and its revisions stay.
     */
    profileId: text('profile_id').references(() => camProfiles.id, { onDelete: 'set null' }),
    title: text('title').notNull(),
    version: integer('version').notNull().default(1),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('spec_sheets_job_idx').on(t.jobId), uniqueIndex('spec_sheets_job_profile_idx').on(t.jobId, t.profileId)],
);

/**
 * One revision of a spec sheet. A draft may be edited; an issued revision never
 * changes (a trigger in the migrations refuses UPDATE and DELETE on it).
 */
export const sheetRevisions = sqliteTable(
  'sheet_revisions',
  {
    id: text('id').primaryKey(),
    sheetId: text('sheet_id')
      .notNull()
      .references(() => specSheets.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    state: text('state', { enum: ['draft', 'issued'] })
      .notNull()
      .default('draft'),
    label: text('label').notNull(),
    spec: text('spec', { mode: 'json' }).$type<ProfileSpec>().notNull(),
    engine: text('engine', { mode: 'json' }).$type<EngineSpec>().notNull(),
    results: text('results', { mode: 'json' }).$type<RevisionResults>().notNull(),
    note: text('note').notNull().default(''),
    /** The profile's core notes when this revision was written: they go to the grinder with it. */
    coreNotes: text('core_notes').notNull().default(''),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    issuedAt: integer('issued_at', { mode: 'timestamp_ms' }),
    issuedToShopId: text('issued_to_shop_id').references(() => shops.id, { onDelete: 'set null' }),
  },
  (t) => [uniqueIndex('sheet_revisions_sheet_number_idx').on(t.sheetId, t.number)],
);

/** One row per write: who did what to which record, and when. */
export const auditLog = sqliteTable(
  'audit_log',
  {
    id: integer('id').primaryKey({ autoIncrement: true }),
    shopId: text('shop_id').references(() => shops.id, { onDelete: 'cascade' }),
    userId: text('user_id').references(() => users.id, { onDelete: 'set null' }),
    action: text('action').notNull(),
    entity: text('entity').notNull(),
    entityId: text('entity_id').notNull(),
    detail: text('detail', { mode: 'json' }).$type<Record<string, unknown>>(),
    createdAt: createdAt(),
  },
  (t) => [index('audit_entity_idx').on(t.entity, t.entityId)],
);

/** A measurement on a job. `data` is validated by the schema of its `kind` (shared/measurements.ts) before it is written. */
export const measurements = sqliteTable(
  'measurements',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    kind: text('kind', { enum: ['ptv-baseline', 'springs', 'pushrod', 'degree', 'lobes'] })
      .$type<MeasurementKind>()
      .notNull(),
    data: text('data', { mode: 'json' }).$type<MeasurementData[MeasurementKind]>().notNull(),
    note: text('note').notNull().default(''),
    version: integer('version').notNull().default(1),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('measurements_job_kind_idx').on(t.jobId, t.kind, t.createdAt)],
);

/** A photo on a job; the file lives under the data folder as uploads/<shop_id>/<stored_name>. */
export const photos = sqliteTable(
  'photos',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    storedName: text('stored_name').notNull().unique(),
    originalName: text('original_name').notNull(),
    mimeType: text('mime_type', { enum: ['image/jpeg', 'image/png', 'image/webp'] }).notNull(),
    size: integer('size').notNull(),
    caption: text('caption').notNull().default(''),
    shareable: integer('shareable', { mode: 'boolean' }).notNull().default(false),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('photos_job_idx').on(t.jobId, t.createdAt)],
);

/** One item of a job's checklist; ticked with who and when. */
export const checklistItems = sqliteTable(
  'checklist_items',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    label: text('label').notNull(),
    position: integer('position').notNull(),
    doneAt: integer('done_at', { mode: 'timestamp_ms' }),
    doneBy: text('done_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('checklist_items_job_idx').on(t.jobId, t.position)],
);

/** A shop's own check limits (overrides of calc's defaults). No row = defaults. */
export const shopSettings = sqliteTable('shop_settings', {
  shopId: text('shop_id')
    .primaryKey()
    .references(() => shops.id, { onDelete: 'cascade' }),
  limits: text('limits', { mode: 'json' }).$type<CheckLimitOverrides>().notNull(),
  version: integer('version').notNull().default(1),
});

/** One run of the fit checks against one sheet revision, kept with it. */
export const fitCheckRuns = sqliteTable(
  'fit_check_runs',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    sheetId: text('sheet_id')
      .notNull()
      .references(() => specSheets.id, { onDelete: 'cascade' }),
    revisionId: text('revision_id')
      .notNull()
      .references(() => sheetRevisions.id, { onDelete: 'cascade' }),
    results: text('results', { mode: 'json' }).$type<FitCheckRun['results']>().notNull(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('fit_check_runs_sheet_idx').on(t.sheetId, t.createdAt)],
);

/** A grind order: one issued sheet revision sent to one grinding shop, moving through the stages in shared/orders.ts. */
export const grindOrders = sqliteTable(
  'grind_orders',
  {
    id: text('id').primaryKey(),
    repairShopId: text('repair_shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    grinderShopId: text('grinder_shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    sheetId: text('sheet_id')
      .notNull()
      .references(() => specSheets.id, { onDelete: 'cascade' }),
    /** The issued revision; one order per revision. */
    revisionId: text('revision_id')
      .notNull()
      .unique()
      .references(() => sheetRevisions.id),
    /** Short checksum of the revision's content (shared/checksum.ts). */
    checksum: text('checksum').notNull(),
    stage: text('stage', { enum: ['sent', 'quoted', 'changes-asked', 'grinding', 'shipped', 'received', 'installed'] })
      .$type<OrderStage>()
      .notNull()
      .default('sent'),
    quote: text('quote', { mode: 'json' }).$type<NonNullable<Order['quote']>>(),
    shipping: text('shipping', { mode: 'json' }).$type<NonNullable<Order['shipping']>>(),
    /**
     * Null while the order is a request for a quote. Set once it is the job's firm order, the one to grind: `owner` when the
     * owner approved its revision, `builder` when a builder confirmed it without the owner, with `firm_reason`.
     */
    firmBy: text('firm_by', { enum: ['owner', 'builder'] }),
    firmAt: integer('firm_at', { mode: 'timestamp_ms' }),
    firmReason: text('firm_reason'),
    version: integer('version').notNull().default(1),
    issuedBy: text('issued_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('grind_orders_grinder_created_id_idx').on(t.grinderShopId, t.createdAt, t.id), index('grind_orders_sheet_idx').on(t.sheetId, t.createdAt)],
);

/** One message in an order's thread between the repair shop and the grinding shop. */
export const orderMessages = sqliteTable(
  'order_messages',
  {
    id: text('id').primaryKey(),
    orderId: text('order_id')
      .notNull()
      .references(() => grindOrders.id, { onDelete: 'cascade' }),
    authorUserId: text('author_user_id').references(() => users.id, { onDelete: 'set null' }),
    authorShopId: text('author_shop_id')
      .notNull()
      .references(() => shops.id, { onDelete: 'cascade' }),
    body: text('body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('order_messages_order_idx').on(t.orderId, t.createdAt)],
);

/**
 * Every e-mail, written in the same transaction as the change it tells of. Without SMTP_URL it is only
 * kept here (`kept`) for the development mailbox; with it, one sender sends it (`pending` → `sent`),
 * retrying with backoff, and after the last try marks it `failed` for the shop to see.
 */
export const outbox = sqliteTable(
  'outbox',
  {
    id: text('id').primaryKey(),
    /** The shop the mail is about, when there is one: its failures are shown to that shop. */
    shopId: text('shop_id').references(() => shops.id, { onDelete: 'set null' }),
    to: text('to').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    html: text('html').notNull(),
    status: text('status', { enum: ['kept', 'pending', 'sent', 'failed'] })
      .notNull()
      .default('kept'),
    attempts: integer('attempts').notNull().default(0),
    /** When a pending mail may next be tried. */
    nextAttemptAt: integer('next_attempt_at', { mode: 'timestamp_ms' }),
    /** A sender's claim on a mail it is sending; after this time another sender may take it. */
    claimedUntil: integer('claimed_until', { mode: 'timestamp_ms' }),
    lastError: text('last_error'),
    sentAt: integer('sent_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [
    index('outbox_created_idx').on(t.createdAt),
    index('outbox_to_created_idx').on(t.to, t.createdAt, t.id),
    index('outbox_due_idx').on(t.status, t.nextAttemptAt),
    index('outbox_shop_status_idx').on(t.shopId, t.status, t.createdAt),
  ],
);

/** The owner's page on a job: the builder's plain words about what failed (one row per job, written on first save). */
export const ownerPages = sqliteTable('owner_pages', {
  jobId: text('job_id')
    .primaryKey()
    .references(() => jobs.id, { onDelete: 'cascade' }),
  shopId: shopRef(),
  whatFailed: text('what_failed').notNull().default(''),
  version: integer('version').notNull().default(1),
  updatedAt: updatedAt(),
});

/** One choice offered to the owner: a spec sheet revision with a price, a deposit and a lead time. */
export const ownerOptions = sqliteTable(
  'owner_options',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    sheetId: text('sheet_id')
      .notNull()
      .references(() => specSheets.id, { onDelete: 'cascade' }),
    revisionId: text('revision_id')
      .notNull()
      .references(() => sheetRevisions.id, { onDelete: 'cascade' }),
    checksum: text('checksum').notNull(),
    title: text('title').notNull(),
    ownerNote: text('owner_note').notNull().default(''),
    priceCents: integer('price_cents').notNull(),
    depositCents: integer('deposit_cents').notNull(),
    leadTimeDays: integer('lead_time_days').notNull(),
    position: integer('position').notNull(),
    version: integer('version').notNull().default(1),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('owner_options_job_idx').on(t.jobId, t.position)],
);

/** A link that opens the owner's page without an account. Only a SHA-256 of the token is kept. */
export const shareLinks = sqliteTable(
  'share_links',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    tokenHash: text('token_hash').notNull().unique(),
    email: text('email'),
    expiresAt: integer('expires_at', { mode: 'timestamp_ms' }).notNull(),
    revokedAt: integer('revoked_at', { mode: 'timestamp_ms' }),
    lastOpenedAt: integer('last_opened_at', { mode: 'timestamp_ms' }),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('share_links_job_idx').on(t.jobId, t.createdAt), index('share_links_shop_email_idx').on(t.shopId, t.email, t.createdAt)],
);

/**
 * The owner's approval of one option; bound to the exact revision by its checksum. One live approval per job: an
 * approval whose revision was superseded before grinding is withdrawn (kept, with when and why) and the owner asked again.
 */
export const ownerApprovals = sqliteTable(
  'owner_approvals',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: text('job_id')
      .notNull()
      .references(() => jobs.id, { onDelete: 'cascade' }),
    optionId: text('option_id')
      .notNull()
      .references(() => ownerOptions.id),
    revisionId: text('revision_id')
      .notNull()
      .references(() => sheetRevisions.id),
    checksum: text('checksum').notNull(),
    optionTitle: text('option_title').notNull(),
    priceCents: integer('price_cents').notNull(),
    depositCents: integer('deposit_cents').notNull(),
    /** The rest of the offer the owner read: its currency, lead time, and the checksum over all of it (shared/checksum.ts offerChecksum). */
    currency: text('currency').notNull().default('usd'),
    leadTimeDays: integer('lead_time_days').notNull().default(0),
    offerChecksum: text('offer_checksum').notNull().default(''),
    approverName: text('approver_name').notNull(),
    shareLinkId: text('share_link_id').references(() => shareLinks.id, { onDelete: 'set null' }),
    withdrawnAt: integer('withdrawn_at', { mode: 'timestamp_ms' }),
    withdrawnReason: text('withdrawn_reason'),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex('owner_approvals_one_live_per_job_idx')
      .on(t.jobId)
      .where(sql`withdrawn_at is null`),
    index('owner_approvals_job_idx').on(t.jobId, t.createdAt),
  ],
);

/**
 * A deposit: one checkout session at the payment service. At most one is open per
 * approval; the row is written (without a session) before the service is called, so
 * two tabs cannot both start one. `refund-due`/`refunded`: a second payment of an
 * already-paid deposit, given back through the payment service.
 */
export const payments = sqliteTable(
  'payments',
  {
    id: text('id').primaryKey(),
    shopId: shopRef(),
    jobId: jobRef(),
    approvalId: text('approval_id')
      .notNull()
      .references(() => ownerApprovals.id, { onDelete: 'cascade' }),
    /** Null only while the session is being created. */
    checkoutSessionId: text('checkout_session_id').unique(),
    checkoutUrl: text('checkout_url'),
    amountCents: integer('amount_cents').notNull(),
    currency: text('currency').notNull(),
    state: text('state', { enum: ['open', 'paid', 'expired', 'refund-due', 'refunded'] })
      .notNull()
      .default('open'),
    paymentIntentId: text('payment_intent_id'),
    refundId: text('refund_id'),
    paidAt: integer('paid_at', { mode: 'timestamp_ms' }),
    createdAt: createdAt(),
  },
  (t) => [
    index('payments_job_idx').on(t.jobId, t.createdAt),
    uniqueIndex('payments_one_open_per_approval_idx')
      .on(t.approvalId)
      .where(sql`state = 'open'`),
  ],
);

/** Every payment-service event handled once; a replayed event id is ignored. */
export const paymentEvents = sqliteTable('payment_events', {
  id: text('id').primaryKey(),
  type: text('type').notNull(),
  /** What the event did: paid, ignored, refused (amount or currency not the deposit's), refund (a second payment). */
  outcome: text('outcome'),
  receivedAt: createdAt(),
});

/**
 * The sign-in library's rate-limit counters (its `rateLimit` model with storage
 * "database"), so every server process counts one address's sign-in attempts together.
 */
export const authRateLimits = sqliteTable('auth_rate_limits', {
  id: text('id').primaryKey(),
  key: text('key').notNull().unique(),
  count: integer('count').notNull(),
  /** Milliseconds since the epoch. */
  lastRequest: integer('last_request').notNull(),
});

/**
 * The app's own rate-limit windows (analyses, share links): one row per limiter and
 * client, shared by every server process. A row whose window has ended counts from one again.
 */
export const rateLimitHits = sqliteTable(
  'rate_limit_hits',
  {
    /** The limiter's prefix and the client's key, e.g. "calc:user:…". */
    key: text('key').primaryKey(),
    hits: integer('hits').notNull(),
    /** When the window ends, milliseconds since the epoch. */
    resetAt: integer('reset_at').notNull(),
  },
  (t) => [index('rate_limit_hits_reset_idx').on(t.resetAt)],
);
