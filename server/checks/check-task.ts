import { gunzipSync, gzipSync } from 'node:zlib';
import { checkSpool, type MaterialFinder } from '../../shared/engine/index';
import { createMaterialLookup, findMaterial, type Material } from '../../shared/data/materials';
import {
  formatPath,
  spoolDocumentSchema,
  type FieldIssue,
  type SpoolDocument,
} from '../../shared/model/spool';
import { findBodyTextIssues } from '../validation';
import { summarizeDocument } from '../spools/check';
import { parseCsv } from '../csv';
import { readLineList } from '../spools/line-list';
import { omitSourceNotes } from '../spools/share-tokens';
import type { StoredCheckSummary } from '../db/schema';

/**
 * What the check pool's worker threads do: the CPU-heavy part of a request (parsing a large
 * document, validating it, checking every element, serialising a result of many megabytes),
 * so the server's event loop stays free for everyone else. Pure apart from a small cache of
 * material lookups per team version.
 */

/** The team's own materials (null: the library alone), keyed by the version that built them. */
export interface MaterialsRef {
  key: string;
  rows: readonly Material[] | null;
}

export type CheckTask =
  /** Validate raw JSON text as a spool document and check it: the answer of POST /api/check. */
  | { kind: 'check-json'; text: string; materials: MaterialsRef }
  /** Check a validated document; the full result as gzip'd JSON (stored with a share link). */
  | {
      kind: 'check-document';
      document: SpoolDocument;
      materials: MaterialsRef;
      omitNotes?: readonly string[];
    }
  /** The public share answer: `head` + the stored check (gzip bytes, or their base64) gunzipped + `tail`, as bytes. */
  | {
      kind: 'share-view';
      head: string;
      checkGz: Uint8Array | string;
      tail: string;
      materials: MaterialsRef;
    }
  /** Check validated documents and keep what the spool list shows. */
  | { kind: 'summaries'; documents: readonly SpoolDocument[]; materials: MaterialsRef }
  /** Read a line-list CSV (text already within the row cap) into checked documents, or its problems. */
  | { kind: 'line-list'; text: string; materials: MaterialsRef };

export type CheckAnswer =
  | { kind: 'json'; bytes: Uint8Array }
  | { kind: 'gzip'; bytes: Uint8Array }
  | { kind: 'invalid'; status: 400 | 422; message: string; issues: FieldIssue[] }
  | { kind: 'summaries'; summaries: StoredCheckSummary[] }
  | { kind: 'line-list'; documents: SpoolDocument[]; summaries: StoredCheckSummary[] };

const lookups = new Map<string, MaterialFinder>();

function finderFor(ref: MaterialsRef): MaterialFinder {
  if (!ref.rows || ref.rows.length === 0) return findMaterial;
  let f = lookups.get(ref.key);
  if (!f) {
    if (lookups.size > 50) lookups.clear();
    f = createMaterialLookup(ref.rows);
    lookups.set(ref.key, f);
  }
  return f;
}

const encoder = new TextEncoder();

/** Run one task (the pool's worker calls this; tests may call it directly). */
export async function runCheckTask(task: CheckTask): Promise<CheckAnswer> {
  const find = finderFor(task.materials);
  if (task.kind === 'share-view') {
    const check = gunzipSync(
      typeof task.checkGz === 'string' ? Buffer.from(task.checkGz, 'base64') : task.checkGz,
    );
    return {
      kind: 'json',
      bytes: Buffer.concat([Buffer.from(task.head), check, Buffer.from(task.tail)]),
    };
  }
  if (task.kind === 'line-list') {
    const csv = parseCsv(task.text);
    if (csv.errors.length > 0) {
      return {
        kind: 'invalid',
        status: 422,
        message: 'The CSV could not be read',
        issues: csv.errors.map(
          (e) =>
            ({
              path: `line ${e.line}`,
              line: e.line,
              column: null,
              message: e.message,
            }) as FieldIssue,
        ),
      };
    }
    const { docs, issues } = await readLineList(csv.headers, csv.rows);
    if (issues.length > 0)
      return {
        kind: 'invalid',
        status: 422,
        message: `${issues.length} problem${issues.length === 1 ? '' : 's'} in the line list; nothing was imported`,
        issues,
      };
    return {
      kind: 'line-list',
      documents: docs,
      summaries: docs.map((d) => summarizeDocument(d, find)),
    };
  }
  if (task.kind === 'summaries') {
    return { kind: 'summaries', summaries: task.documents.map((d) => summarizeDocument(d, find)) };
  }
  let document: SpoolDocument;
  if (task.kind === 'check-json') {
    let input: unknown;
    try {
      input = JSON.parse(task.text);
    } catch {
      return {
        kind: 'invalid',
        status: 400,
        message: 'The request body is not valid JSON',
        issues: [{ path: 'body', message: 'is not valid JSON' }],
      };
    }
    const textIssues = findBodyTextIssues(input);
    if (textIssues.length > 0)
      return {
        kind: 'invalid',
        status: 422,
        message: 'The request has invalid fields',
        issues: textIssues,
      };
    const r = spoolDocumentSchema.safeParse(input);
    if (!r.success) {
      return {
        kind: 'invalid',
        status: 422,
        message: 'The request has invalid fields',
        issues: r.error.issues.map((i) => ({ path: formatPath(i.path), message: i.message })),
      };
    }
    document = r.data as SpoolDocument;
  } else document = task.document;
  const result = checkSpool(document, { findMaterial: find });
  // A check stored with a share link leaves out the team's own material source notes.
  const json = JSON.stringify(
    task.kind === 'check-document' && task.omitNotes
      ? omitSourceNotes(result, task.omitNotes)
      : result,
  );
  if (task.kind === 'check-document') return { kind: 'gzip', bytes: gzipSync(json, { level: 6 }) };
  return { kind: 'json', bytes: encoder.encode(json) };
}
