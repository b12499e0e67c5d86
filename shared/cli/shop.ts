#!/usr/bin/env node
/**
 * The headless fabrication sheet: `npm run shop -- [--json | --csv[=sheet|elements|cut-list|bom]] <spool.json | ->`.
 * Exit 0: the sheet was printed · 2: bad input (the message names the field).
 */
import { readFileSync } from 'node:fs';
import { parseSpoolDocument, type FieldIssue, type SpoolDocument } from '../model/spool';
import { checkSpool, fmt } from '../engine/index';
import {
  buildFabricationSheet,
  bomTable,
  cutListTable,
  elementTable,
  sheetTable,
  tableToCsv,
  toShopJson,
  type FabricationSheet,
  type Table,
} from '../shop/index';
import { MASS_LABELS, UNIT_LABELS } from '../units/units';

export interface ShopCliResult {
  readonly code: 0 | 2;
  readonly stdout: string;
  readonly stderr: string;
}

const USAGE =
  'usage: npm run shop -- [--json | --csv[=sheet|elements|cut-list|bom]] <spool.json | ->';
const CSV_TABLES = ['sheet', 'elements', 'cut-list', 'bom'] as const;
type CsvTable = (typeof CSV_TABLES)[number];

function badInput(json: boolean, message: string, details: readonly FieldIssue[]): ShopCliResult {
  const lines = details.map((d) => `  ${d.path}: ${d.message}`);
  const stderr = `spoolwright shop: ${message}\n${lines.join('\n')}${lines.length ? '\n' : ''}`;
  const stdout = json
    ? `${JSON.stringify({ error: { code: 'invalid_input', message, details } })}\n`
    : '';
  return { code: 2, stdout, stderr };
}

function layout(table: Table): string[] {
  const cells = table.rows.map((r) => r.map((c) => (c === null ? '-' : String(c))));
  const head = table.fields.map(String);
  const widths = head.map((h, i) => Math.max(h.length, ...cells.map((r) => (r[i] ?? '').length)));
  const line = (row: readonly string[]) =>
    row
      .map((c, i) => c.padEnd(widths[i] ?? 0))
      .join('  ')
      .trimEnd();
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...cells.map(line)];
}

/** The readable sheet: bend list, cut list, bill of materials, totals, hydrotest, caution. */
export function formatSheet(sheet: FabricationSheet): string {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  const out: string[] = [
    `Fabrication sheet${sheet.name ? `: ${sheet.name}` : ''}${sheet.line ? ` (line ${sheet.line})` : ''}`,
    '',
  ];
  const bends = sheet.elements.filter((e) => e.bend);
  if (bends.length > 0) {
    out.push('Bend list');
    out.push(
      ...layout({
        fields: [
          'bend',
          'NPS',
          'angle',
          `R ${u.length}`,
          'R/D',
          'factor',
          `before bending ${u.length}`,
          'order',
          `extrados after ${u.length}`,
          `intrados after ${u.length}`,
          'heavier',
        ],
        rows: bends.map((e) => {
          const b = e.bend!;
          return [
            e.id,
            e.nps,
            `${fmt(b.angle)}°`,
            fmt(b.radius),
            fmt(b.radiusOverD),
            b.tableFactor === null ? '-' : fmt(b.tableFactor),
            `${fmt(b.wallBeforeBending)} (${b.governingEstimate})`,
            `${e.orderSchedule ?? '-'} / ${fmt(e.orderWall)}`,
            fmt(b.extradosWallAfter),
            fmt(b.intradosWallAfter),
            b.orderHeavier ? 'ORDER HEAVIER' : '',
          ];
        }),
      }),
    );
    out.push(`  ${bends[0]!.bend!.flattening}`, '');
  }
  out.push('Cut list');
  out.push(
    ...layout({
      fields: [
        'element',
        'kind',
        'NPS',
        'order',
        `cut ${u.length}`,
        `arc ${u.length}`,
        'end 1',
        'end 2',
        `mass ${m.mass}`,
      ],
      rows: sheet.elements.map((e) => [
        e.id,
        e.kind,
        e.nps,
        `${e.orderSchedule ?? '-'} / ${fmt(e.orderWall)}`,
        fmt(e.cutLength),
        e.bend ? fmt(e.bend.arcLength) : '-',
        e.ends[0].text,
        e.ends[1].text,
        fmt(e.mass),
      ]),
    }),
  );
  out.push(
    `  butt welds: ${sheet.welds}${sheet.otherJoints > 0 ? ` · other joints: ${sheet.otherJoints}` : ''}`,
    '',
  );
  out.push('Bill of materials');
  out.push(...layout(bomTable(sheet)).map((l) => l));
  out.push('');
  out.push(
    `developed length ${fmt(sheet.developedLength)} ${u.length} · pipe to order ${fmt(sheet.orderLength)} ${u.length}`,
  );
  out.push(
    `spool mass ${fmt(sheet.totalMass)} ${m.mass} empty, ${fmt(sheet.filledMass)} ${m.mass} full of water`,
  );
  const h = sheet.hydrotest;
  if (h) {
    out.push(
      '',
      `Hydrotest at ${fmt(h.testTemperature)} ${u.temperature}: ${fmt(h.pressure)} ${u.pressure}`,
      `  ${h.equation}`,
    );
    for (const n of h.notes) out.push(`  note: ${n}`);
    out.push(`  ${h.caution}`);
  }
  for (const e of sheet.elements) for (const n of e.notes) out.push(`${e.id}: ${n}`);
  for (const n of sheet.notes) out.push(`note: ${n}`);
  out.push('', sheet.caution);
  return `${out.join('\n')}\n`;
}

function parseArgs(args: readonly string[]): {
  json: boolean;
  csv: CsvTable | null;
  files: string[];
  error: string | null;
} {
  let json = false;
  let csv: CsvTable | null = null;
  const files: string[] = [];
  for (const a of args) {
    if (a === '--json') json = true;
    else if (a === '--csv') csv = 'sheet';
    else if (a.startsWith('--csv=')) {
      const t = a.slice(6);
      if (!(CSV_TABLES as readonly string[]).includes(t))
        return {
          json,
          csv,
          files,
          error: `unknown table "${t}" for --csv (sheet, elements, cut-list or bom); ${USAGE}`,
        };
      csv = t as CsvTable;
    } else if (a.startsWith('--'))
      return { json, csv, files, error: `unknown option ${a}; ${USAGE}` };
    else files.push(a);
  }
  if (json && csv) return { json, csv, files, error: `give --json or --csv, not both; ${USAGE}` };
  if (files.length !== 1) return { json, csv, files, error: USAGE };
  return { json, csv, files, error: null };
}

/** Run the shop command on already-read input (testable without a process). */
export function runShop(
  args: readonly string[],
  readInput: (file: string) => string,
): ShopCliResult {
  const a = parseArgs(args);
  if (a.error) return badInput(a.json, a.error, []);
  const file = a.files[0] ?? '-';
  const label = file === '-' ? 'standard input' : file;
  let text: string;
  try {
    text = readInput(file);
  } catch (err) {
    return badInput(a.json, `cannot read ${label}: ${(err as Error).message}`, []);
  }
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (err) {
    return badInput(a.json, `${label} is not valid JSON: ${(err as Error).message}`, []);
  }
  const parsed = parseSpoolDocument(data);
  if (!parsed.ok) return badInput(a.json, `${label} is not a valid spool document`, parsed.issues);
  const doc: SpoolDocument = parsed.doc;
  const check = checkSpool(doc);
  const issues = check.elements.flatMap((e) => e.inputIssues);
  if (issues.length > 0)
    return badInput(a.json, `${label}: some elements cannot be checked`, issues);
  const sheet = buildFabricationSheet(doc, check);
  if (a.json) return { code: 0, stdout: `${JSON.stringify(toShopJson(sheet))}\n`, stderr: '' };
  if (a.csv) {
    const table =
      a.csv === 'sheet'
        ? sheetTable(sheet)
        : a.csv === 'elements'
          ? elementTable(doc, check)
          : a.csv === 'cut-list'
            ? cutListTable(sheet)
            : bomTable(sheet);
    return { code: 0, stdout: tableToCsv(table), stderr: '' };
  }
  return { code: 0, stdout: formatSheet(sheet), stderr: '' };
}

function main(): void {
  const result = runShop(process.argv.slice(2), (file) =>
    readFileSync(file === '-' ? 0 : file, 'utf8'),
  );
  if (result.stdout) process.stdout.write(result.stdout);
  if (result.stderr) process.stderr.write(result.stderr);
  process.exitCode = result.code;
}

const invokedDirectly = process.argv[1] !== undefined && /shop\.(ts|js)$/.test(process.argv[1]);
if (invokedDirectly) main();
