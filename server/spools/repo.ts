import { randomUUID } from 'node:crypto';
import { and, asc, count, desc, eq, ilike, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { Db } from '../db/client';
import { spoolEvents, spoolRevisions, spools, user, type StoredCheckSummary } from '../db/schema';
import type { CheckStatus, CheckSummary } from '../../shared/engine/types';
import type { SpoolDocument } from '../../shared/model/spool';
import type { SpoolStatus } from '../../shared/model/permissions';
import { EMPTY_SUMMARY } from './check';

export interface UserRef {
  id: string;
  name: string;
}

/** A row of the spool list (DEVELOPERS.md `SpoolSummary`). */
export interface SpoolSummary {
  id: string;
  name: string;
  line: string;
  status: SpoolStatus;
  revision: number;
  version: number;
  worst: { elementId: string; status: CheckStatus } | null;
  summary: CheckSummary;
  createdAt: string;
  updatedAt: string;
}

/** A spool with its document (DEVELOPERS.md `Spool`). */
export interface Spool extends SpoolSummary {
  document: SpoolDocument;
  createdBy: UserRef | null;
  updatedBy: UserRef | null;
}

export const SORTS = {
  name: asc(spools.name),
  '-name': desc(spools.name),
  line: asc(spools.line),
  '-line': desc(spools.line),
  status: asc(spools.status),
  '-status': desc(spools.status),
  revision: asc(spools.revision),
  '-revision': desc(spools.revision),
  createdAt: asc(spools.createdAt),
  '-createdAt': desc(spools.createdAt),
  updatedAt: asc(spools.updatedAt),
  '-updatedAt': desc(spools.updatedAt),
} as const;
export type SpoolSort = keyof typeof SORTS;

const summaryColumns = {
  id: spools.id,
  name: spools.name,
  line: spools.line,
  status: spools.status,
  revision: spools.revision,
  version: spools.version,
  checkSummary: spools.checkSummary,
  createdAt: spools.createdAt,
  updatedAt: spools.updatedAt,
};

type SummaryRow = {
  id: string;
  name: string;
  line: string;
  status: string;
  revision: number;
  version: number;
  checkSummary: StoredCheckSummary | null;
  createdAt: Date;
  updatedAt: Date;
};

function toSummary(r: SummaryRow): SpoolSummary {
  return {
    id: r.id,
    name: r.name,
    line: r.line,
    status: r.status as SpoolStatus,
    revision: r.revision,
    version: r.version,
    worst: r.checkSummary?.worst ?? null,
    summary: r.checkSummary?.summary ?? { ...EMPTY_SUMMARY },
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
  };
}

/** Name and line columns follow the document. */
export function describeDocument(doc: SpoolDocument) {
  return { name: doc.name?.trim() || 'Untitled spool', line: doc.line?.trim() ?? '' };
}

const live = (teamId: string, id: string) =>
  and(eq(spools.id, id), eq(spools.teamId, teamId), isNull(spools.deletedAt));

export async function listSpools(
  db: Db,
  teamId: string,
  q: {
    search?: string | undefined;
    status?: readonly SpoolStatus[] | undefined;
    sort: SpoolSort;
    page: number;
    pageSize: number;
  },
) {
  const where: SQL[] = [eq(spools.teamId, teamId), isNull(spools.deletedAt)];
  if (q.search) {
    const pattern = `%${q.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push(or(ilike(spools.name, pattern), ilike(spools.line, pattern))!);
  }
  if (q.status && q.status.length > 0) where.push(inArray(spools.status, [...q.status]));
  const cond = and(...where);
  const [rows, totals] = await Promise.all([
    db
      .select(summaryColumns)
      .from(spools)
      .where(cond)
      .orderBy(SORTS[q.sort], asc(spools.id))
      .limit(q.pageSize)
      .offset((q.page - 1) * q.pageSize),
    db.select({ n: count() }).from(spools).where(cond),
  ]);
  return {
    items: rows.map(toSummary),
    total: totals[0]?.n ?? 0,
    page: q.page,
    pageSize: q.pageSize,
  };
}

const creator = alias(user, 'creator');
const updater = alias(user, 'updater');

export async function getSpool(db: Db, teamId: string, id: string): Promise<Spool | undefined> {
  const [r] = await db
    .select({
      ...summaryColumns,
      document: spools.document,
      createdById: creator.id,
      createdByName: creator.name,
      updatedById: updater.id,
      updatedByName: updater.name,
    })
    .from(spools)
    .leftJoin(creator, eq(creator.id, spools.createdBy))
    .leftJoin(updater, eq(updater.id, spools.updatedBy))
    .where(live(teamId, id))
    .limit(1);
  if (!r) return undefined;
  return {
    ...toSummary(r),
    document: r.document,
    createdBy: r.createdById ? { id: r.createdById, name: r.createdByName ?? '' } : null,
    updatedBy: r.updatedById ? { id: r.updatedById, name: r.updatedByName ?? '' } : null,
  };
}

/** Several spools by id, in the order given (missing ones left out); one query. */
export async function getSpools(
  db: Db,
  teamId: string,
  ids: readonly string[],
  chunk = 200,
): Promise<Spool[]> {
  if (ids.length === 0) return [];
  if (ids.length > chunk) {
    const out: Spool[] = [];
    for (let i = 0; i < ids.length; i += chunk) {
      out.push(...(await getSpools(db, teamId, ids.slice(i, i + chunk), chunk)));
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
    return out;
  }
  const rows = await db
    .select({
      ...summaryColumns,
      document: spools.document,
      createdById: creator.id,
      createdByName: creator.name,
      updatedById: updater.id,
      updatedByName: updater.name,
    })
    .from(spools)
    .leftJoin(creator, eq(creator.id, spools.createdBy))
    .leftJoin(updater, eq(updater.id, spools.updatedBy))
    .where(and(eq(spools.teamId, teamId), isNull(spools.deletedAt), inArray(spools.id, [...ids])));
  const byId = new Map(
    rows.map((r) => [
      r.id,
      {
        ...toSummary(r),
        document: r.document,
        createdBy: r.createdById ? { id: r.createdById, name: r.createdByName ?? '' } : null,
        updatedBy: r.updatedById ? { id: r.updatedById, name: r.updatedByName ?? '' } : null,
      } satisfies Spool,
    ]),
  );
  return ids.map((id) => byId.get(id)).filter((s): s is Spool => s !== undefined);
}

export async function insertSpool(
  db: Db,
  v: {
    teamId: string;
    userId: string;
    document: SpoolDocument;
    checkSummary: StoredCheckSummary | null;
    id?: string;
  },
): Promise<string> {
  const id = v.id ?? randomUUID();
  await db.insert(spools).values({
    id,
    teamId: v.teamId,
    ...describeDocument(v.document),
    document: v.document,
    checkSummary: v.checkSummary,
    createdBy: v.userId,
    updatedBy: v.userId,
  });
  return id;
}

/** Insert many new spools with multi-row INSERTs of `chunk` rows, yielding between chunks; ids in order. */
export async function insertSpools(
  db: Db,
  v: {
    teamId: string;
    userId: string;
    items: readonly { document: SpoolDocument; checkSummary: StoredCheckSummary | null }[];
  },
  chunk = 250,
): Promise<string[]> {
  const ids: string[] = [];
  for (let i = 0; i < v.items.length; i += chunk) {
    const rows = v.items.slice(i, i + chunk).map((it) => {
      const id = randomUUID();
      ids.push(id);
      return {
        id,
        teamId: v.teamId,
        ...describeDocument(it.document),
        document: it.document,
        checkSummary: it.checkSummary,
        createdBy: v.userId,
        updatedBy: v.userId,
      };
    });
    await db.insert(spools).values(rows);
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return ids;
}

export type SaveOutcome = { kind: 'saved' } | { kind: 'not_found' } | { kind: 'conflict' };

/**
 * Save a new document if `baseVersion` is still current: the write is one UPDATE … WHERE
 * version = base, so of two saves from the same base exactly one wins. Editing a checked or
 * released spool opens the next revision in draft; editing a submitted one withdraws it to draft.
 */
export async function saveSpool(
  db: Db,
  v: {
    teamId: string;
    id: string;
    userId: string;
    baseVersion: number;
    document: SpoolDocument;
    checkSummary: StoredCheckSummary | null;
  },
): Promise<SaveOutcome> {
  return db.transaction(async (tx) => {
    const [cur] = await tx
      .select({ status: spools.status, revision: spools.revision, version: spools.version })
      .from(spools)
      .where(live(v.teamId, v.id))
      .for('update');
    if (!cur) return { kind: 'not_found' } as const;
    if (cur.version !== v.baseVersion) return { kind: 'conflict' } as const;
    const opensRevision = cur.status === 'checked' || cur.status === 'released';
    const revision = opensRevision ? cur.revision + 1 : cur.revision;
    const updated = await tx
      .update(spools)
      .set({
        ...describeDocument(v.document),
        document: v.document,
        checkSummary: v.checkSummary,
        status: 'draft',
        revision,
        version: sql`${spools.version} + 1`,
        updatedBy: v.userId,
        updatedAt: sql`now()`,
      })
      .where(and(live(v.teamId, v.id), eq(spools.version, v.baseVersion)))
      .returning({ version: spools.version });
    if (updated.length === 0) return { kind: 'conflict' } as const;
    if (cur.status !== 'draft') {
      await tx.insert(spoolEvents).values({
        spoolId: v.id,
        revision,
        fromStatus: cur.status,
        toStatus: 'draft',
        note: opensRevision
          ? `Edited: revision ${revision} opened`
          : 'Edited while submitted: withdrawn to draft',
        userId: v.userId,
      });
    }
    return { kind: 'saved' } as const;
  });
}

export async function softDeleteSpool(
  db: Db,
  teamId: string,
  id: string,
  userId: string,
): Promise<boolean> {
  const r = await db
    .update(spools)
    .set({ deletedAt: sql`now()`, updatedBy: userId })
    .where(live(teamId, id))
    .returning({ id: spools.id });
  return r.length > 0;
}

export type TransitionOutcome =
  | { kind: 'done'; from: SpoolStatus; revision: number; lastEditors: string[] }
  | { kind: 'not_found' }
  | { kind: 'conflict' }
  | { kind: 'invalid'; from: SpoolStatus }
  | { kind: 'check_failed'; summary: CheckSummary };

/** Move a spool along the lifecycle; checked and released revisions are frozen in spool_revisions. */
export async function transitionSpool(
  db: Db,
  v: {
    teamId: string;
    id: string;
    userId: string;
    to: SpoolStatus;
    note?: string | undefined;
    baseVersion?: number | undefined;
    isAllowed: (from: SpoolStatus, to: SpoolStatus) => boolean;
  },
): Promise<TransitionOutcome> {
  return db.transaction(async (tx) => {
    const [cur] = await tx.select().from(spools).where(live(v.teamId, v.id)).for('update');
    if (!cur) return { kind: 'not_found' } as const;
    if (v.baseVersion !== undefined && cur.version !== v.baseVersion)
      return { kind: 'conflict' } as const;
    const from = cur.status as SpoolStatus;
    if (!v.isAllowed(from, v.to)) return { kind: 'invalid', from } as const;
    const summary = cur.checkSummary?.summary;
    if (v.to === 'released' && (!summary || summary.fail > 0 || summary.invalid > 0)) {
      return { kind: 'check_failed', summary: summary ?? { ...EMPTY_SUMMARY } } as const;
    }
    await tx
      .update(spools)
      .set({
        status: v.to,
        version: sql`${spools.version} + 1`,
        updatedBy: v.userId,
        updatedAt: sql`now()`,
      })
      .where(and(live(v.teamId, v.id), eq(spools.version, cur.version)));
    if (v.to === 'checked' || v.to === 'released') {
      const frozen = {
        status: v.to,
        name: cur.name,
        line: cur.line,
        document: cur.document,
        checkSummary: cur.checkSummary,
        version: cur.version + 1,
        createdBy: v.userId,
      };
      await tx
        .insert(spoolRevisions)
        .values({ spoolId: cur.id, revision: cur.revision, ...frozen })
        .onConflictDoUpdate({
          target: [spoolRevisions.spoolId, spoolRevisions.revision],
          set: { ...frozen, createdAt: sql`now()` },
        });
    }
    await tx.insert(spoolEvents).values({
      spoolId: cur.id,
      revision: cur.revision,
      fromStatus: from,
      toStatus: v.to,
      note: v.note ?? null,
      userId: v.userId,
    });
    const lastEditors = [cur.createdBy, cur.updatedBy].filter((x): x is string => !!x);
    return { kind: 'done', from, revision: cur.revision, lastEditors } as const;
  });
}

export interface RevisionInfo {
  revision: number;
  status: SpoolStatus;
  name: string;
  line: string;
  version: number;
  current: boolean;
  frozenAt: string | null;
  frozenBy: UserRef | null;
  summary: CheckSummary;
  worst: StoredCheckSummary['worst'];
}

/** Every engineering revision: the frozen ones plus the live one (marked current). */
export async function listRevisions(
  db: Db,
  teamId: string,
  id: string,
): Promise<RevisionInfo[] | undefined> {
  const cur = await getSpool(db, teamId, id);
  if (!cur) return undefined;
  const rows = await db
    .select({
      revision: spoolRevisions.revision,
      status: spoolRevisions.status,
      name: spoolRevisions.name,
      line: spoolRevisions.line,
      version: spoolRevisions.version,
      checkSummary: spoolRevisions.checkSummary,
      createdAt: spoolRevisions.createdAt,
      byId: creator.id,
      byName: creator.name,
    })
    .from(spoolRevisions)
    .leftJoin(creator, eq(creator.id, spoolRevisions.createdBy))
    .where(eq(spoolRevisions.spoolId, id))
    .orderBy(asc(spoolRevisions.revision));
  const items: RevisionInfo[] = rows
    .filter((r) => r.revision !== cur.revision)
    .map((r) => ({
      revision: r.revision,
      status: r.status as SpoolStatus,
      name: r.name,
      line: r.line,
      version: r.version,
      current: false,
      frozenAt: r.createdAt.toISOString(),
      frozenBy: r.byId ? { id: r.byId, name: r.byName ?? '' } : null,
      summary: r.checkSummary?.summary ?? { ...EMPTY_SUMMARY },
      worst: r.checkSummary?.worst ?? null,
    }));
  const frozenCurrent = rows.find((r) => r.revision === cur.revision);
  items.push({
    revision: cur.revision,
    status: cur.status,
    name: cur.name,
    line: cur.line,
    version: cur.version,
    current: true,
    frozenAt: frozenCurrent ? frozenCurrent.createdAt.toISOString() : null,
    frozenBy: frozenCurrent?.byId
      ? { id: frozenCurrent.byId, name: frozenCurrent.byName ?? '' }
      : null,
    summary: cur.summary,
    worst: cur.worst,
  });
  return items;
}

/** One revision with its document; the current revision reads the live spool. */
export async function getRevision(db: Db, teamId: string, id: string, revision: number) {
  const cur = await getSpool(db, teamId, id);
  if (!cur) return undefined;
  if (revision === cur.revision) {
    return {
      spoolId: id,
      revision,
      status: cur.status,
      name: cur.name,
      line: cur.line,
      version: cur.version,
      current: true,
      document: cur.document,
      summary: cur.summary,
      worst: cur.worst,
      updatedAt: cur.updatedAt,
    };
  }
  const [r] = await db
    .select()
    .from(spoolRevisions)
    .where(and(eq(spoolRevisions.spoolId, id), eq(spoolRevisions.revision, revision)))
    .limit(1);
  if (!r) return undefined;
  return {
    spoolId: id,
    revision,
    status: r.status as SpoolStatus,
    name: r.name,
    line: r.line,
    version: r.version,
    current: false,
    document: r.document,
    summary: r.checkSummary?.summary ?? { ...EMPTY_SUMMARY },
    worst: r.checkSummary?.worst ?? null,
    updatedAt: r.createdAt.toISOString(),
  };
}

export async function listEvents(db: Db, spoolId: string) {
  const rows = await db
    .select({
      id: spoolEvents.id,
      revision: spoolEvents.revision,
      from: spoolEvents.fromStatus,
      to: spoolEvents.toStatus,
      note: spoolEvents.note,
      userId: creator.id,
      userName: creator.name,
      createdAt: spoolEvents.createdAt,
    })
    .from(spoolEvents)
    .leftJoin(creator, eq(creator.id, spoolEvents.userId))
    .where(eq(spoolEvents.spoolId, spoolId))
    .orderBy(asc(spoolEvents.id));
  return rows.map((r) => ({
    id: r.id,
    revision: r.revision,
    from: r.from as SpoolStatus,
    to: r.to as SpoolStatus,
    note: r.note,
    user: r.userId ? { id: r.userId, name: r.userName ?? '' } : null,
    createdAt: r.createdAt.toISOString(),
  }));
}
