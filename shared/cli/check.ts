#!/usr/bin/env node
/**
 * The headless checker: `npm run check -- [--json] <spool.json | ->`.
 * Exit 0: every element passes or is marginal · 1: any fails or needs review · 2: bad input.
 */
import { readFileSync } from 'node:fs';
import { parseSpoolDocument, type FieldIssue } from '../model/spool';
import { CAUTION } from '../model/caution';
import { checkSpool, fmt, type ElementCheck, type SpoolCheck } from '../engine/index';
import { UNIT_LABELS } from '../units/units';

export interface CliResult {
  readonly code: 0 | 1 | 2;
  readonly stdout: string;
  readonly stderr: string;
}

const USAGE = 'usage: npm run check -- [--json] <spool.json | ->';

/** Exit code for a completed check: 1 when any element fails or needs review. */
export function exitCodeFor(check: SpoolCheck): 0 | 1 {
  return check.summary.fail > 0 || check.summary.review > 0 ? 1 : 0;
}

function badInput(json: boolean, message: string, details: readonly FieldIssue[]): CliResult {
  const lines = details.map((d) => `  ${d.path}: ${d.message}`);
  const stderr = `spoolwright check: ${message}\n${lines.join('\n')}${lines.length ? '\n' : ''}`;
  const stdout = json ? `${JSON.stringify({ error: { code: 'invalid_input', message, details } })}\n` : '';
  return { code: 2, stdout, stderr };
}

function pad(s: string, n: number): string {
  return s.length >= n ? s : s + ' '.repeat(n - s.length);
}

function sizeOf(e: ElementCheck, el: { nps?: unknown; schedule?: unknown }): string {
  if (el.nps !== undefined) return `NPS ${String(el.nps)}${el.schedule !== undefined ? ` / ${String(el.schedule)}` : ''}`;
  return `D ${fmt(e.outsideDiameter)}`;
}

/** The readable table: one row per element, its messages below, then the summary and caution. */
export function formatTable(check: SpoolCheck, doc: { elements: readonly { nps?: unknown; schedule?: unknown }[] }): string {
  const u = UNIT_LABELS[check.units];
  const head = ['element', 'kind', 'size', `T ${u.length}`, `T req ${u.length}`, 'governs', 'margin', `MAWP ${u.pressure}`, 'lightest', 'status'];
  const rows = check.elements.map((e) => [
    e.id,
    e.kind,
    sizeOf(e, doc.elements[e.index] ?? {}),
    fmt(e.nominalWall),
    fmt(e.requiredNominalWall),
    e.governing ?? '-',
    e.margin === null ? '-' : `${(e.margin * 100).toFixed(1)} %`,
    fmt(e.mawp),
    e.lightestSchedule ?? '-',
    e.status.toUpperCase(),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) => cells.map((c, i) => pad(c, widths[i] ?? 0)).join('  ').trimEnd();
  const out: string[] = [line(head), widths.map((w) => '-'.repeat(w)).join('  ')];
  check.elements.forEach((e, i) => {
    out.push(line(rows[i] ?? []));
    if (e.preBend) {
      out.push(`    before bending: ${fmt(e.preBend.requiredOrderedWall)} ${u.length} ordered wall${e.preBend.orderHeavier ? ` — ORDER HEAVIER${e.preBend.orderSchedule ? ` (schedule ${e.preBend.orderSchedule})` : ''}` : ''}`);
    }
    for (const m of e.messages) if (m.level !== 'info') out.push(`    ${m.level}: ${m.text}`);
  });
  const s = check.summary;
  out.push('', `summary: ${s.pass} pass, ${s.marginal} marginal, ${s.fail} fail, ${s.review} review`);
  out.push(`marginal = passing with less than 10 % margin on the ordered nominal wall.`);
  out.push('', CAUTION);
  return `${out.join('\n')}\n`;
}

/** Run the checker on already-read input text (testable without a process). */
export function runCheck(args: readonly string[], readInput: (file: string) => string): CliResult {
  const json = args.includes('--json');
  const files = args.filter((a) => a !== '--json');
  const unknown = files.filter((a) => a.startsWith('--'));
  if (unknown.length > 0 || files.length !== 1) {
    return badInput(json, unknown.length > 0 ? `unknown option ${unknown[0] ?? ''}; ${USAGE}` : USAGE, []);
  }
  const file = files[0] ?? '-';
  const label = file === '-' ? 'standard input' : file;
  let text: string;
  try {
    text = readInput(file);
  } catch (err) {
    return badInput(json, `cannot read ${label}: ${(err as Error).message}`, []);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    return badInput(json, `${label} is not valid JSON: ${(err as Error).message}`, []);
  }
  const parsed = parseSpoolDocument(data);
  if (!parsed.ok) return badInput(json, `${label} is not a valid spool document`, parsed.issues);
  const check = checkSpool(parsed.doc);
  const issues = check.elements.flatMap((e) => e.inputIssues);
  if (issues.length > 0) return badInput(json, `${label}: some elements cannot be checked`, issues);
  const code = exitCodeFor(check);
  if (json) return { code, stdout: `${JSON.stringify(check)}\n`, stderr: '' };
  return { code, stdout: formatTable(check, parsed.doc), stderr: '' };
}

function main(): void {
  const result = runCheck(process.argv.slice(2), (file) => readFileSync(file === '-' ? 0 : file, 'utf8'));
  if (result.stdout) process.stdout.write(result.stdout);
  if (result.stderr) process.stderr.write(result.stderr);
  process.exitCode = result.code;
}

const invokedDirectly = process.argv[1] !== undefined && /check\.(ts|js)$/.test(process.argv[1]);
if (invokedDirectly) main();
