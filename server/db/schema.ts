import { sql } from 'drizzle-orm';
import { index, integer, jsonb, pgTable, primaryKey, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
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
  (t) => [primaryKey({ columns: [t.teamId, t.userId] }), uniqueIndex('team_members_user_idx').on(t.userId)],
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
    index('spools_live_idx').on(t.teamId).where(sql`${t.deletedAt} is null`),
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
    /** Unguessable token used in the public URL. */
    id: text('id').primaryKey(),
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
  },
  (t) => [index('share_links_spool_idx').on(t.spoolId)],
);

/** Mail sent in development and tests (the fake transport writes here instead of an SMTP server). */
export const outbox = pgTable('outbox', {
  id: serial('id').primaryKey(),
  to: text('to').notNull(),
  from: text('from').notNull(),
  subject: text('subject').notNull(),
  text: text('text').notNull(),
  /** The full message as the mail library rendered it. */
  raw: text('raw').notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).defaultNow().notNull(),
});

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
  (t) => [uniqueIndex('team_invitations_token_idx').on(t.tokenHash), index('team_invitations_team_idx').on(t.teamId, t.createdAt)],
);
