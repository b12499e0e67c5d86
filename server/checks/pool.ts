import os from 'node:os';
import { fileURLToPath } from 'node:url';
import Piscina from 'piscina';
import { HttpError } from '../errors';
import type { SpoolDocument } from '../../shared/model/spool';
import type { StoredCheckSummary } from '../db/schema';
import { runCheckTask, type CheckAnswer, type CheckTask, type MaterialsRef } from './check-task';

/** Documents up to this many elements are checked on the calling thread (a few ms); larger ones in the pool. */
export const INLINE_ELEMENTS = 50;

const WORKER = fileURLToPath(new URL('./check-worker.mjs', import.meta.url));

export interface CheckPoolOptions {
  /** Worker threads (default: cores − 1, at least 1, at most 4). */
  threads?: number;
  /** Tasks waiting beyond the running ones before new work is refused with 503 (default 16). */
  queue?: number;
}

/**
 * A bounded pool of worker threads for spool checks: at most `threads` checks run at once and
 * at most `queue` wait; beyond that a request is refused at once (503 `busy`) rather than
 * piling up memory. The event loop only moves bytes in and out.
 */
export class CheckPool {
  private pool: Piscina | undefined;
  private readonly threads: number;
  private readonly queue: number;

  constructor(opts: CheckPoolOptions = {}) {
    this.threads = opts.threads ?? Math.max(1, Math.min(4, os.availableParallelism() - 1));
    this.queue = opts.queue ?? 16;
  }

  private get piscina(): Piscina {
    this.pool ??= new Piscina({
      filename: WORKER,
      minThreads: 0,
      maxThreads: this.threads,
      maxQueue: this.queue,
      idleTimeout: 30_000,
      // Workers load tsx themselves (check-worker.mjs); inherited loader flags are not needed.
      execArgv: [],
    });
    return this.pool;
  }

  private async run(task: CheckTask): Promise<CheckAnswer | Uint8Array> {
    const p = this.piscina;
    if (p.queueSize >= this.queue) throw busy();
    try {
      return (await p.run(task)) as CheckAnswer | Uint8Array;
    } catch (err) {
      if (err instanceof Error && /queue is at limit/i.test(err.message)) throw busy();
      throw err;
    }
  }

  /** POST /api/check: raw JSON text in, the result's JSON bytes out (or a 400/422). */
  async checkJson(text: string, materials: MaterialsRef): Promise<Uint8Array> {
    const out = await this.run({ kind: 'check-json', text, materials });
    if (out instanceof Uint8Array) return out;
    if (out.kind === 'invalid')
      throw new HttpError(
        out.status,
        out.status === 400 ? 'bad_request' : 'validation',
        out.message,
        out.issues,
      );
    throw new Error('check pool: unexpected answer');
  }

  /** The full check of a validated document, gzip'd JSON (kept with a share link). */
  async checkDocumentGz(
    document: SpoolDocument,
    materials: MaterialsRef,
    omitNotes?: readonly string[],
  ): Promise<Uint8Array> {
    const small = document.elements.length <= INLINE_ELEMENTS;
    const task: CheckTask = {
      kind: 'check-document',
      document,
      materials,
      ...(omitNotes ? { omitNotes } : {}),
    };
    const out = small ? await runCheckTask(task) : await this.run(task);
    if (out instanceof Uint8Array || out.kind !== 'gzip')
      throw new Error('check pool: unexpected answer');
    return out.bytes;
  }

  /** The public share answer: `head` + the stored check + `tail` as JSON bytes, assembled off the event loop. */
  async shareView(head: string, checkGz: Uint8Array | string, tail: string): Promise<Uint8Array> {
    const task: CheckTask = {
      kind: 'share-view',
      head,
      checkGz,
      tail,
      materials: { key: 'library', rows: null },
    };
    const size = typeof checkGz === 'string' ? checkGz.length : checkGz.byteLength;
    const out = size < 16 * 1024 ? await runCheckTask(task) : await this.run(task);
    if (out instanceof Uint8Array) return out;
    if (out.kind !== 'json') throw new Error('check pool: unexpected answer');
    return out.bytes;
  }

  /** Check summaries of validated documents (small ones inline, the rest in the pool). */
  async summaries(
    documents: readonly SpoolDocument[],
    materials: MaterialsRef,
  ): Promise<StoredCheckSummary[]> {
    const elements = documents.reduce((n, d) => n + d.elements.length, 0);
    const out =
      elements <= INLINE_ELEMENTS && documents.length <= INLINE_ELEMENTS
        ? await runCheckTask({ kind: 'summaries', documents, materials })
        : await this.run({ kind: 'summaries', documents, materials });
    if (out instanceof Uint8Array || out.kind !== 'summaries')
      throw new Error('check pool: unexpected answer');
    return out.summaries;
  }

  /** Read and check a line-list CSV in the pool: the documents with their summaries, or a 422. */
  async lineList(
    text: string,
    materials: MaterialsRef,
  ): Promise<{ documents: SpoolDocument[]; summaries: StoredCheckSummary[] }> {
    const out = await this.run({ kind: 'line-list', text, materials });
    if (out instanceof Uint8Array) throw new Error('check pool: unexpected answer');
    if (out.kind === 'invalid')
      throw new HttpError(out.status, 'validation', out.message, out.issues);
    if (out.kind !== 'line-list') throw new Error('check pool: unexpected answer');
    return out;
  }

  async close() {
    const p = this.pool;
    this.pool = undefined;
    if (p) await p.destroy();
  }
}

const busy = () =>
  new HttpError(503, 'busy', 'The server is checking many spools right now; try again in a moment');
