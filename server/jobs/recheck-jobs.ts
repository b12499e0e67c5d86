import { and, asc, desc, eq, gt, inArray, isNull, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { jobs, spools, type StoredCheckSummary } from '../db/schema';
import type { TeamMaterials } from '../materials/team-materials';
import type { CheckPool } from '../checks/pool';
import type { Logger } from '../logger';
import { createSlicer } from '../yield';
import type { SpoolDocument } from '../../shared/model/spool';

/** Spools read, checked and written per step; the event loop gets a turn between steps. */
export const RECHECK_BATCH = 100;

type JobRow = typeof jobs.$inferSelect;

/** A job as the admin sees it (GET /api/admin/jobs). */
export interface JobView {
  id: number;
  kind: string;
  status: 'queued' | 'running' | 'done' | 'failed';
  reason: string;
  /** Spools to re-check (0 until the job starts). */
  total: number;
  /** Spools re-checked so far. */
  done: number;
  /** Spools whose stored summary changed. */
  changed: number;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

export function toJobView(r: JobRow): JobView {
  return {
    id: r.id,
    kind: r.kind,
    status: r.status as JobView['status'],
    reason: r.reason,
    total: r.total,
    done: r.done,
    changed: r.changed,
    error: r.error,
    createdAt: r.createdAt.toISOString(),
    startedAt: r.startedAt ? r.startedAt.toISOString() : null,
    finishedAt: r.finishedAt ? r.finishedAt.toISOString() : null,
  };
}

const turn = () => new Promise<void>((resolve) => setImmediate(resolve));
const sameSummary = (a: StoredCheckSummary | null, b: StoredCheckSummary) =>
  a !== null && JSON.stringify(a) === JSON.stringify(b);

/**
 * Background re-checks of a team's spools after its materials changed. Spools are read in
 * batches by id, checked in the check pool and their stored summaries written one short UPDATE
 * at a time, guarded by the version read — so a save is never blocked, and a save made
 * meanwhile (which checked with the new materials already) is never overwritten. One job runs
 * per team at a time; a request while one waits joins it, while one runs queues one more.
 */
export class RecheckJobs {
  private readonly active = new Map<string, Promise<void>>();
  private readonly pending = new Map<string, number>();
  private stopped = false;

  constructor(
    private readonly deps: { db: Db; materials: TeamMaterials; checks: CheckPool; logger: Logger },
  ) {}

  /** Queue a re-check of the team's spools and return the job (already queued or new). */
  async start(teamId: string, reason: string, userId: string | null): Promise<JobView> {
    const { db } = this.deps;
    const waiting = this.pending.get(teamId);
    if (waiting !== undefined) {
      const [row] = await db.select().from(jobs).where(eq(jobs.id, waiting)).limit(1);
      if (row && row.status === 'queued') return toJobView(row);
    }
    const [row] = await db
      .insert(jobs)
      .values({ teamId, kind: 'recheck', status: 'queued', reason, createdBy: userId })
      .returning();
    this.pending.set(teamId, row!.id);
    this.kick(teamId);
    return toJobView(row!);
  }

  /** Jobs left queued or running by an earlier process are run again. */
  async resume(): Promise<void> {
    const rows = await this.deps.db
      .select()
      .from(jobs)
      .where(inArray(jobs.status, ['queued', 'running']))
      .orderBy(asc(jobs.id));
    for (const r of rows) {
      if (this.pending.get(r.teamId) !== undefined) {
        await this.deps.db
          .update(jobs)
          .set({ status: 'done', finishedAt: new Date(), error: 'superseded by a later re-check' })
          .where(eq(jobs.id, r.id));
        continue;
      }
      await this.deps.db.update(jobs).set({ status: 'queued' }).where(eq(jobs.id, r.id));
      this.pending.set(r.teamId, r.id);
      this.kick(r.teamId);
    }
  }

  async list(teamId: string, limit = 20): Promise<JobView[]> {
    const rows = await this.deps.db
      .select()
      .from(jobs)
      .where(eq(jobs.teamId, teamId))
      .orderBy(desc(jobs.id))
      .limit(limit);
    return rows.map(toJobView);
  }

  async get(teamId: string, id: number): Promise<JobView | undefined> {
    const [row] = await this.deps.db
      .select()
      .from(jobs)
      .where(and(eq(jobs.teamId, teamId), eq(jobs.id, id)))
      .limit(1);
    return row ? toJobView(row) : undefined;
  }

  /** Resolves once the team has no queued or running job (tests, shutdown). */
  async idle(teamId?: string): Promise<void> {
    for (;;) {
      const running =
        teamId === undefined
          ? [...this.active.values()]
          : [this.active.get(teamId)].filter((p): p is Promise<void> => !!p);
      if (running.length === 0) return;
      await Promise.all(running);
    }
  }

  /** Stop taking new batches; running batches finish. */
  async stop(): Promise<void> {
    this.stopped = true;
    await Promise.allSettled([...this.active.values()]);
  }

  private kick(teamId: string) {
    if (this.active.has(teamId) || this.stopped) return;
    const loop = (async () => {
      for (;;) {
        const id = this.pending.get(teamId);
        if (id === undefined || this.stopped) break;
        this.pending.delete(teamId);
        await this.run(id, teamId);
      }
    })().finally(() => this.active.delete(teamId));
    this.active.set(teamId, loop);
  }

  private async run(jobId: number, teamId: string) {
    const { db, materials, checks, logger } = this.deps;
    const live = and(eq(spools.teamId, teamId), isNull(spools.deletedAt));
    try {
      const [{ n } = { n: 0 }] = await db
        .select({ n: sql<number>`count(*)::int` })
        .from(spools)
        .where(live);
      await db
        .update(jobs)
        .set({
          status: 'running',
          startedAt: new Date(),
          total: n,
          done: 0,
          changed: 0,
          error: null,
        })
        .where(eq(jobs.id, jobId));
      const ref = await materials.ref(teamId);
      const slice = createSlicer();
      let last = '';
      let done = 0;
      let changed = 0;
      for (;;) {
        if (this.stopped) return;
        const rows = await db
          .select({
            id: spools.id,
            version: spools.version,
            document: spools.document,
            checkSummary: spools.checkSummary,
          })
          .from(spools)
          .where(and(live, gt(spools.id, last)))
          .orderBy(asc(spools.id))
          .limit(RECHECK_BATCH);
        if (rows.length === 0) break;
        const summaries = await checks.summaries(
          rows.map((r) => r.document as SpoolDocument),
          ref,
        );
        for (const [i, r] of rows.entries()) {
          await slice();
          const s = summaries[i]!;
          if (sameSummary(r.checkSummary, s)) continue;
          // Derived data: the version does not move, and a newer save keeps its own summary.
          const out = await db
            .update(spools)
            .set({ checkSummary: s })
            .where(and(eq(spools.id, r.id), eq(spools.version, r.version)))
            .returning({ id: spools.id });
          changed += out.length;
        }
        done += rows.length;
        last = rows[rows.length - 1]!.id;
        await db.update(jobs).set({ done, changed }).where(eq(jobs.id, jobId));
        await turn();
      }
      await db
        .update(jobs)
        .set({ status: 'done', done, changed, finishedAt: new Date() })
        .where(eq(jobs.id, jobId));
    } catch (err) {
      logger.error(`re-check job ${jobId} failed`, err);
      await db
        .update(jobs)
        .set({
          status: 'failed',
          error:
            'The re-check stopped on an error; start it again by re-importing or ask an administrator',
          finishedAt: new Date(),
        })
        .where(eq(jobs.id, jobId))
        .catch(() => undefined);
    }
  }
}
