#!/usr/bin/env node
/**
 * The headless checker: `npm run check -- [--json] [--pdf out.pdf] <spool.json | ->`.
 * Exit 0: every element passes or is marginal · 1: any fails or needs review · 2: bad input
 * (or the calc sheet could not be written).
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { parseSpoolDocument, type FieldIssue } from '../model/spool';
import { CAUTION } from '../model/caution';
import {
  checkSpool,
  EXTERNAL_BASIS_LABEL,
  fmt,
  type ElementCheck,
  type SpoolCheck,
} from '../engine/index';
import { UNIT_LABELS } from '../units/units';
import { buildCalcSheet, type CalcSheet } from '../report/calc-sheet';

export interface CliResult {
  readonly code: 0 | 1 | 2;
  readonly stdout: string;
  readonly stderr: string;
  /** With --pdf: the calc sheet to write and where (the caller renders and writes it). */
  readonly pdf?: { readonly file: string; readonly sheet: CalcSheet };
}

const USAGE = 'usage: npm run check -- [--json] [--pdf out.pdf] <spool.json | ->';

/** Exit code for a completed check: 1 when any element fails or needs review. */
export function exitCodeFor(check: SpoolCheck): 0 | 1 {
  return check.summary.fail > 0 || check.summary.review > 0 ? 1 : 0;
}

function badInput(json: boolean, message: string, details: readonly FieldIssue[]): CliResult {
  const lines = details.map((d) => `  ${d.path}: ${d.message}`);
  const stderr = `spoolwright check: ${message}\n${lines.join('\n')}${lines.length ? '\n' : ''}`;
  const stdout = json
    ? `${JSON.stringify({ error: { code: 'invalid_input', message, details } })}\n`
    : '';
  return { code: 2, stdout, stderr };
}

function pad(s: string, n: number): string {
  return s.length >= n ? s : s + ' '.repeat(n - s.length);
}

function sizeOf(e: ElementCheck, el: { nps?: unknown; schedule?: unknown }): string {
  if (el.nps !== undefined)
    return `NPS ${String(el.nps)}${el.schedule !== undefined ? ` / ${String(el.schedule)}` : ''}`;
  return `D ${fmt(e.outsideDiameter)}`;
}

/** The readable table: one row per element, its messages below, then the summary and caution. */
export function formatTable(
  check: SpoolCheck,
  doc: { elements: readonly { nps?: unknown; schedule?: unknown }[] },
): string {
  const u = UNIT_LABELS[check.units];
  const head = [
    'element',
    'kind',
    'size',
    `T ${u.length}`,
    `T req ${u.length}`,
    'governs',
    'margin',
    `MAWP ${u.pressure}`,
    'lightest',
    'status',
  ];
  const rows = check.elements.map((e) => [
    e.id,
    e.kind,
    sizeOf(e, doc.elements[e.index] ?? {}),
    fmt(e.nominalWall),
    fmt(e.requiredNominalWall),
    e.governing ?? '-',
    e.margin === null ? '-' : `${(e.margin * 100).toFixed(1)} %`,
    fmt(e.mawp),
    e.lightest ? `${e.lightest.names.join(' / ')} (${e.lightest.standard})` : '-',
    e.status.toUpperCase(),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]) =>
    cells
      .map((c, i) => pad(c, widths[i] ?? 0))
      .join('  ')
      .trimEnd();
  const out: string[] = [line(head), widths.map((w) => '-'.repeat(w)).join('  ')];
  check.elements.forEach((e, i) => {
    out.push(line(rows[i] ?? []));
    if (e.preBend) {
      out.push(
        `    before bending: ${fmt(e.preBend.requiredOrderedWall)} ${u.length} ordered wall${e.preBend.orderHeavier ? ` — ORDER HEAVIER${e.preBend.order ? ` (schedule ${e.preBend.order.label})` : ''}` : ''}`,
      );
    }
    const ext = e.cases.find((c) => c.case === 'external');
    if (ext?.allowablePressure !== undefined) {
      out.push(
        `    external: allowable ${fmt(ext.allowablePressure)} ${u.pressure} = min(UG-28 ${fmt(ext.allowableUg28 ?? 0)}, VIII-2 4.4.5.1 ${fmt(ext.allowableVIII2 ?? 0)}) — ${EXTERNAL_BASIS_LABEL[ext.allowableBasis ?? 'ug28-elastic']} governs`,
      );
    }
    for (const m of e.messages) if (m.level !== 'info') out.push(`    ${m.level}: ${m.text}`);
  });
  const s = check.summary;
  out.push(
    '',
    `summary: ${s.pass} pass, ${s.marginal} marginal, ${s.fail} fail, ${s.review} review`,
  );
  out.push(`marginal = passing with less than 10 % margin on the ordered nominal wall.`);
  out.push('', CAUTION);
  return `${out.join('\n')}\n`;
}

/** Run the checker on already-read input text (testable without a process). */
export function runCheck(
  args: readonly string[],
  readInput: (file: string) => string,
  now: () => Date = () => new Date(),
): CliResult {
  const json = args.includes('--json');
  let pdfFile: string | undefined;
  const rest: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i] ?? '';
    if (a === '--json') continue;
    if (a === '--pdf' || a.startsWith('--pdf=')) {
      const f = a === '--pdf' ? args[++i] : a.slice('--pdf='.length);
      if (f === undefined || f === '' || f.startsWith('--'))
        return badInput(json, `--pdf needs a file name; ${USAGE}`, []);
      pdfFile = f;
      continue;
    }
    rest.push(a);
  }
  const files = rest;
  const unknown = files.filter((a) => a.startsWith('--'));
  if (unknown.length > 0 || files.length !== 1) {
    return badInput(
      json,
      unknown.length > 0 ? `unknown option ${unknown[0] ?? ''}; ${USAGE}` : USAGE,
      [],
    );
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
  // A document outside the server has no team, revision or history.
  const pdf = pdfFile
    ? {
        file: pdfFile,
        sheet: buildCalcSheet({
          team: null,
          revision: null,
          state: null,
          document: parsed.doc,
          check,
          history: [],
          historyNote: `No history: made by the headless checker from ${label}.`,
          generatedAt: now().toISOString(),
        }),
      }
    : undefined;
  const out = json ? `${JSON.stringify(check)}\n` : formatTable(check, parsed.doc);
  return { code, stdout: out, stderr: '', ...(pdf ? { pdf } : {}) };
}

async function main(): Promise<void> {
  const result = runCheck(process.argv.slice(2), (file) =>
    readFileSync(file === '-' ? 0 : file, 'utf8'),
  );
  let code: number = result.code;
  let stderr = result.stderr;
  if (result.pdf) {
    try {
      // Loaded only when asked for: pdfkit and the font files are not needed for a plain check.
      const { renderCalcSheetPdf } = await import('../report/calc-sheet-pdf');
      const bytes = await renderCalcSheetPdf(result.pdf.sheet);
      writeFileSync(result.pdf.file, bytes);
      stderr += `spoolwright check: calc sheet written to ${result.pdf.file} (${bytes.length} bytes)\n`;
    } catch (err) {
      stderr += `spoolwright check: cannot write the calc sheet to ${result.pdf.file}: ${(err as Error).message}\n`;
      code = 2;
    }
  }
  if (result.stdout) process.stdout.write(result.stdout);
  if (stderr) process.stderr.write(stderr);
  process.exitCode = code;
}

const invokedDirectly = process.argv[1] !== undefined && /check\.(ts|js)$/.test(process.argv[1]);
if (invokedDirectly) void main();
