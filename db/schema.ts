/**
 * Edgefield's database schema (Drizzle ORM, PostgreSQL dialect).
 *
 * The same schema and the committed SQL migrations in db/migrations run on the embedded
 * PGlite database and on a PostgreSQL server (DATABASE_URL). Identifiers are text UUIDs
 * generated in the app, so a malformed id in a URL simply matches nothing (404) instead of
 * raising a type error in the database.
 *
 * Change it with `npm run db:generate` (drizzle-kit writes a new SQL migration), then
 * commit the migration. Never edit a committed migration.
 */
import { sql } from 'drizzle-orm';
import {
  bigserial,
  boolean,
  customType,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  type AnyPgColumn,
} from 'drizzle-orm/pg-core';

const newId = () => crypto.randomUUID();

/** Binary column; Uint8Array on both drivers (node-postgres returns a Buffer, a Uint8Array subclass). */
export const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({
  dataType() {
    return 'bytea';
  },
  toDriver(value) {
    return typeof Buffer !== 'undefined' && !(value instanceof Buffer)
      ? Buffer.from(value.buffer, value.byteOffset, value.byteLength)
      : value;
  },
  fromDriver(value) {
    return value instanceof Uint8Array ? new Uint8Array(value.buffer, value.byteOffset, value.byteLength) : value;
  },
});

const createdAt = () => timestamp('created_at', { mode: 'date', withTimezone: true }).notNull().defaultNow();
const updatedAt = () => timestamp('updated_at', { mode: 'date', withTimezone: true }).notNull().defaultNow();

export const ROLES = ['owner', 'editor', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

// ---------------------------------------------------------------------------------------
// Users and the next-auth tables (column names as @auth/drizzle-adapter expects them)
// ---------------------------------------------------------------------------------------

export const users = pgTable('users', {
  id: text('id').primaryKey().$defaultFn(newId),
  name: text('name'),
  email: text('email').notNull().unique(),
  emailVerified: timestamp('emailVerified', { mode: 'date' }),
  image: text('image'),
  /** bcrypt hash (cost ≥ 10); null for accounts that only sign in by e-mail link. */
  passwordHash: text('password_hash'),
  /** E-mail notifications on comments and mentions (issue 7). */
  notifyByEmail: boolean('notify_by_email').notNull().default(true),
  createdAt: createdAt(),
});
export type User = typeof users.$inferSelect;

export const accounts = pgTable(
  'accounts',
  {
    userId: text('userId')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    type: text('type').$type<'email' | 'oauth' | 'oidc' | 'webauthn'>().notNull(),
    provider: text('provider').notNull(),
    providerAccountId: text('providerAccountId').notNull(),
    refresh_token: text('refresh_token'),
    access_token: text('access_token'),
    expires_at: integer('expires_at'),
    token_type: text('token_type'),
    scope: text('scope'),
    id_token: text('id_token'),
    session_state: text('session_state'),
  },
  (t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })],
);

export const sessions = pgTable('sessions', {
  sessionToken: text('sessionToken').primaryKey(),
  userId: text('userId')
    .notNull()
    .references(() => users.id, { onDelete: 'cascade' }),
  expires: timestamp('expires', { mode: 'date' }).notNull(),
});

export const verificationTokens = pgTable(
  'verification_tokens',
  {
    identifier: text('identifier').notNull(),
    token: text('token').notNull(),
    expires: timestamp('expires', { mode: 'date' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.identifier, t.token] })],
);

// ---------------------------------------------------------------------------------------
// Workspaces and membership
// ---------------------------------------------------------------------------------------

export const workspaces = pgTable('workspaces', {
  id: text('id').primaryKey().$defaultFn(newId),
  name: text('name').notNull(),
  /** Whether read-only share links may be opened by signed-out visitors (issue 7). */
  allowPublicLinks: boolean('allow_public_links').notNull().default(false),
  /** Billing plan (issue 7): 'free' | 'team'. */
  plan: text('plan').notNull().default('free'),
  /** The payment service's customer and subscription ids (issue 7); null until the owner upgrades. */
  billingCustomerId: text('billing_customer_id'),
  billingSubscriptionId: text('billing_subscription_id'),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
});
export type Workspace = typeof workspaces.$inferSelect;

export const memberships = pgTable(
  'memberships',
  {
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    role: text('role').$type<Role>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.workspaceId, t.userId] }), index('memberships_user_idx').on(t.userId)],
);
export type Membership = typeof memberships.$inferSelect;

export const invitations = pgTable(
  'invitations',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    role: text('role').$type<Role>().notNull(),
    /** SHA-256 of the token in the link; the token itself is never stored. */
    tokenHash: text('token_hash').notNull().unique(),
    invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp('expires_at', { mode: 'date', withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { mode: 'date', withTimezone: true }),
    acceptedAt: timestamp('accepted_at', { mode: 'date', withTimezone: true }),
    acceptedBy: text('accepted_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('invitations_workspace_idx').on(t.workspaceId)],
);

// ---------------------------------------------------------------------------------------
// Sections and their immutable revisions
// ---------------------------------------------------------------------------------------

export const sections = pgTable(
  'sections',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    /** The newest revision; null only inside the transaction that creates the section. */
    latestRevisionId: text('latest_revision_id').references((): AnyPgColumn => sectionRevisions.id, {
      onDelete: 'set null',
    }),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
    /** Soft delete: set when deleted, cleared on restore. */
    deletedAt: timestamp('deleted_at', { mode: 'date', withTimezone: true }),
  },
  (t) => [index('sections_workspace_idx').on(t.workspaceId, t.updatedAt)],
);
export type SectionRow = typeof sections.$inferSelect;

export const sectionRevisions = pgTable(
  'section_revisions',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    sectionId: text('section_id')
      .notNull()
      .references((): AnyPgColumn => sections.id, { onDelete: 'cascade' }),
    /** 1, 2, 3 ... per section. */
    number: integer('number').notNull(),
    /** The section file ("edgefield.section/1"), as validated by lib/section/schema.ts. */
    content: jsonb('content').notNull(),
    message: text('message').notNull().default(''),
    authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex('section_revisions_number_uq').on(t.sectionId, t.number)],
);
export type SectionRevisionRow = typeof sectionRevisions.$inferSelect;

// ---------------------------------------------------------------------------------------
// Solves, comments
// ---------------------------------------------------------------------------------------

export const SOLVE_STATUSES = ['done', 'failed'] as const;
export type SolveStatus = (typeof SOLVE_STATUSES)[number];

export const solves = pgTable(
  'solves',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    sectionId: text('section_id')
      .notNull()
      .references(() => sections.id, { onDelete: 'cascade' }),
    revisionId: text('revision_id')
      .notNull()
      .references(() => sectionRevisions.id, { onDelete: 'cascade' }),
    /** Solve settings (preset, tolerance ...), as sent by the client. */
    settings: jsonb('settings').notNull(),
    /** Hash of the canonical settings; with revisionId it identifies a solve (dedupe). */
    settingsHash: text('settings_hash').notNull(),
    /** The "edgefield.result/1" JSON (lib/engine/types.ts SectionResult). */
    result: jsonb('result'),
    /** Compressed field blob (RESULTS helper's format); null until uploaded. */
    field: bytea('field'),
    fieldBytes: integer('field_bytes'),
    status: text('status').$type<SolveStatus>().notNull(),
    authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [
    uniqueIndex('solves_revision_settings_uq').on(t.revisionId, t.settingsHash),
    index('solves_workspace_idx').on(t.workspaceId, t.createdAt),
    index('solves_section_idx').on(t.sectionId),
  ],
);
export type SolveRow = typeof solves.$inferSelect;

export const comments = pgTable(
  'comments',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    solveId: text('solve_id')
      .notNull()
      .references(() => solves.id, { onDelete: 'cascade' }),
    authorId: text('author_id').references(() => users.id, { onDelete: 'set null' }),
    body: text('body').notNull(),
    createdAt: createdAt(),
    editedAt: timestamp('edited_at', { mode: 'date', withTimezone: true }),
    deletedAt: timestamp('deleted_at', { mode: 'date', withTimezone: true }),
  },
  (t) => [index('comments_solve_idx').on(t.solveId, t.createdAt)],
);
export type CommentRow = typeof comments.$inferSelect;

// ---------------------------------------------------------------------------------------
// Audit trail, demo mail
// ---------------------------------------------------------------------------------------

export const auditEvents = pgTable(
  'audit_events',
  {
    id: bigserial('id', { mode: 'number' }).primaryKey(),
    workspaceId: text('workspace_id').references(() => workspaces.id, { onDelete: 'cascade' }),
    actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
    /** Dotted verb, e.g. "section.create", "section.revision", "solve.create". */
    action: text('action').notNull(),
    targetType: text('target_type').notNull(),
    targetId: text('target_id'),
    data: jsonb('data').notNull().default(sql`'{}'::jsonb`),
    createdAt: createdAt(),
  },
  (t) => [index('audit_events_workspace_idx').on(t.workspaceId, t.createdAt)],
);

/** Mails caught by the fake SMTP server in demo mode (shown at /demo/mailbox). */
export const demoMails = pgTable('demo_mails', {
  id: bigserial('id', { mode: 'number' }).primaryKey(),
  from: text('from_address').notNull().default(''),
  to: text('to_addresses').notNull().default(''),
  subject: text('subject').notNull().default(''),
  text: text('text_body').notNull().default(''),
  html: text('html_body').notNull().default(''),
  raw: text('raw').notNull().default(''),
  createdAt: createdAt(),
});
export type DemoMail = typeof demoMails.$inferSelect;

// ---------------------------------------------------------------------------------------
// Ahead of later issues (cheap now, saves a migration later)
// ---------------------------------------------------------------------------------------

/** Read-only share links to a solve or a section (issue 7). */
export const shareLinks = pgTable(
  'share_links',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    targetType: text('target_type').$type<'solve' | 'section'>().notNull(),
    targetId: text('target_id').notNull(),
    tokenHash: text('token_hash').notNull().unique(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    expiresAt: timestamp('expires_at', { mode: 'date', withTimezone: true }),
    revokedAt: timestamp('revoked_at', { mode: 'date', withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index('share_links_workspace_idx').on(t.workspaceId)],
);

/** In-app notifications (issue 7). */
export const notifications = pgTable(
  'notifications',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    userId: text('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    workspaceId: text('workspace_id').references(() => workspaces.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    data: jsonb('data').notNull().default(sql`'{}'::jsonb`),
    readAt: timestamp('read_at', { mode: 'date', withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index('notifications_user_idx').on(t.userId, t.createdAt)],
);

/** Custom dielectric materials saved per workspace (issue 4). `content` is a section-format material. */
export const workspaceMaterials = pgTable(
  'workspace_materials',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    content: jsonb('content').notNull(),
    createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    updatedAt: updatedAt(),
  },
  (t) => [index('workspace_materials_workspace_idx').on(t.workspaceId)],
);

/** Uploaded files kept with a section (issue 7: SVG, DXF, measured CSV). */
export const files = pgTable(
  'files',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    workspaceId: text('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    sectionId: text('section_id').references(() => sections.id, { onDelete: 'cascade' }),
    kind: text('kind').notNull(),
    name: text('name').notNull(),
    mediaType: text('media_type').notNull(),
    bytes: integer('bytes').notNull(),
    data: bytea('data').notNull(),
    uploadedBy: text('uploaded_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('files_section_idx').on(t.sectionId)],
);

/** Payment-service webhook events already applied (issue 7): a redelivered event changes nothing. */
export const billingEvents = pgTable('billing_events', {
  eventId: text('event_id').primaryKey(),
  type: text('type').notNull(),
  workspaceId: text('workspace_id').references(() => workspaces.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
});
