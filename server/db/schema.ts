import { sql } from 'drizzle-orm';
import {
  customType,
  index,
  integer,
  jsonb,
  pgTable,
  primaryKey,
  serial,
  text,
  timestamp,
  uniqueIndex,
} from 'drizzle-orm/pg-core';
import type { SpoolDocument } from '../../shared/model/spool';
import type { CheckSummary, CheckStatus } from '../../shared/engine/types';
import type { Material } from '../../shared/data/materials';
import { user } from './auth-schema';

export * from './auth-schema';

/** What a saved spool remembers of its last check: counts per status and the worst element. */
export interface StoredCheckSummary {
  summary: CheckSummary;
  worst: { elementId: string; status: CheckStatus } | null;
}

/** Raw bytes (PostgreSQL bytea). */
const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({ dataType: () => 'bytea' });

const timestamps = {
  createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).defaultNow().notNull(),
};

export const teams = pgTable('teams', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  ...timestamps,
});

/** One team per user; the role decides what the member may do (shared/model/permissions.ts). */
export const teamMembers = pgTable(
  'team_members',
  {
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    userId: text('user_id')
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    role: text('role').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [
    primaryKey({ columns: [t.teamId, t.userId] }),
    uniqueIndex('team_members_user_idx').on(t.userId),
  ],
);

export const spools = pgTable(
  'spools',
  {
    id: text('id').primaryKey(),
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    line: text('line').notNull().default(''),
    /** Lifecycle: draft | submitted | checked | released. */
    status: text('status').notNull().default('draft'),
    /** Engineering revision: starts at 0, rises when a checked or released spool is edited. */
    revision: integer('revision').notNull().default(0),
    /** Save counter for optimistic concurrency. */
    version: integer('version').notNull().default(1),
    document: jsonb('document').$type<SpoolDocument>().notNull(),
    checkSummary: jsonb('check_summary').$type<StoredCheckSummary>(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    updatedBy: text('updated_by').references(() => user.id, { onDelete: 'set null' }),
    ...timestamps,
    deletedAt: timestamp('deleted_at', { withTimezone: true }),
  },
  (t) => [
    index('spools_team_updated_idx').on(t.teamId, t.updatedAt),
    index('spools_team_name_idx').on(t.teamId, t.name),
    index('spools_live_idx')
      .on(t.teamId)
      .where(sql`${t.deletedAt} is null`),
  ],
);

/** The frozen document of an engineering revision, written when the revision is checked or released. */
export const spoolRevisions = pgTable(
  'spool_revisions',
  {
    spoolId: text('spool_id')
      .notNull()
      .references(() => spools.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    status: text('status').notNull(),
    name: text('name').notNull(),
    line: text('line').notNull().default(''),
    document: jsonb('document').$type<SpoolDocument>().notNull(),
    checkSummary: jsonb('check_summary').$type<StoredCheckSummary>(),
    version: integer('version').notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [primaryKey({ columns: [t.spoolId, t.revision] })],
);

/** Every lifecycle transition (and the return to draft that an edit of a checked spool causes). */
export const spoolEvents = pgTable(
  'spool_events',
  {
    id: serial('id').primaryKey(),
    spoolId: text('spool_id')
      .notNull()
      .references(() => spools.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    fromStatus: text('from_status').notNull(),
    toStatus: text('to_status').notNull(),
    note: text('note'),
    userId: text('user_id').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('spool_events_spool_idx').on(t.spoolId, t.id)],
);

/** A read-only view of one spool revision for someone without an account. */
export const shareLinks = pgTable(
  'share_links',
  {
    id: text('id').primaryKey(),
    /** sha-256 (hex) of the unguessable token in the public URL; the token itself is shown once, at creation. */
    tokenHash: text('token_hash').notNull(),
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    spoolId: text('spool_id')
      .notNull()
      .references(() => spools.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    status: text('status').notNull(),
    name: text('name').notNull(),
    line: text('line').notNull().default(''),
    document: jsonb('document').$type<SpoolDocument>().notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    /** The check of the shared revision as gzip'd JSON, made once when the link is created (the revision is frozen). */
    checkGz: bytea('check_gz'),
  },
  (t) => [
    index('share_links_spool_idx').on(t.spoolId),
    uniqueIndex('share_links_token_hash_idx').on(t.tokenHash),
  ],
);

/**
 * Mail the development catcher received (no SMTP_URL), one row per addressees' team, with
 * one-use links redacted; the whole messages are .eml files in DATA_DIR/mail.
 */
export const outbox = pgTable(
  'outbox',
  {
    id: serial('id').primaryKey(),
    /** Team of the addressees; null when they belong to none (then no outbox view shows it). */
    teamId: text('team_id').references(() => teams.id, { onDelete: 'cascade' }),
    to: text('to').notNull(),
    from: text('from').notNull(),
    subject: text('subject').notNull(),
    text: text('text').notNull(),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('outbox_team_idx').on(t.teamId, t.id)],
);

/** Review comments, optionally pinned to one element of one revision. */
export const spoolComments = pgTable(
  'spool_comments',
  {
    id: serial('id').primaryKey(),
    spoolId: text('spool_id')
      .notNull()
      .references(() => spools.id, { onDelete: 'cascade' }),
    revision: integer('revision').notNull(),
    /** Element id within the document; null for a comment on the whole spool. */
    elementId: text('element_id'),
    body: text('body').notNull(),
    userId: text('user_id').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
    resolvedAt: timestamp('resolved_at', { withTimezone: true }),
    resolvedBy: text('resolved_by').references(() => user.id, { onDelete: 'set null' }),
  },
  (t) => [index('spool_comments_spool_idx').on(t.spoolId, t.id)],
);

/** A team's own materials (uploaded with a source note); they take precedence over the library. */
export const teamMaterials = pgTable(
  'team_materials',
  {
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    /** Material id as documents reference it, e.g. "A106-B" or a team code. */
    id: text('id').notNull(),
    material: jsonb('material').$type<Material>().notNull(),
    sourceNote: text('source_note').notNull(),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.teamId, t.id] })],
);

/**
 * An e-mailed invitation to join a team. Only the SHA-256 of the one-use token is kept; the
 * link in the mail is the only copy of the token.
 */
export const teamInvitations = pgTable(
  'team_invitations',
  {
    id: text('id').primaryKey(),
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    email: text('email').notNull(),
    name: text('name').notNull(),
    role: text('role').notNull(),
    tokenHash: text('token_hash').notNull(),
    invitedBy: text('invited_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    acceptedAt: timestamp('accepted_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
  },
  (t) => [
    uniqueIndex('team_invitations_token_idx').on(t.tokenHash),
    index('team_invitations_team_idx').on(t.teamId, t.createdAt),
  ],
);

/**
 * Background work of a team, e.g. re-checking every spool after its materials changed. Rows
 * outlive the process: a job found unfinished at start-up is run again (its work is idempotent).
 */
export const jobs = pgTable(
  'jobs',
  {
    id: serial('id').primaryKey(),
    teamId: text('team_id')
      .notNull()
      .references(() => teams.id, { onDelete: 'cascade' }),
    /** `recheck`: refresh the stored check summaries of the team's spools. */
    kind: text('kind').notNull(),
    /** queued | running | done | failed */
    status: text('status').notNull().default('queued'),
    /** Why the job was started, e.g. "materials import (3 materials)". */
    reason: text('reason').notNull().default(''),
    /** Spools to process (known once the job starts) and processed so far. */
    total: integer('total').notNull().default(0),
    done: integer('done').notNull().default(0),
    /** Spools whose stored summary changed. */
    changed: integer('changed').notNull().default(0),
    error: text('error'),
    createdBy: text('created_by').references(() => user.id, { onDelete: 'set null' }),
    createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
  },
  (t) => [index('jobs_team_idx').on(t.teamId, t.id), index('jobs_status_idx').on(t.status)],
);
