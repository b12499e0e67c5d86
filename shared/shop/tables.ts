/**
 * The sheet as flat tables (header with units + rows), for CSV downloads and the headless
 * `npm run shop -- --csv`. Numbers are rounded to 6 significant digits.
 */
import Papa from 'papaparse';
import type { SpoolCheck } from '../engine/index';
import type { SpoolDocument } from '../model/spool';
import { neutraliseRow } from '../csv/neutralise';
import { MASS_LABELS, UNIT_LABELS } from '../units/units';
import type { FabricationSheet } from './fabrication-sheet';

export interface Table {
  readonly fields: readonly string[];
  readonly rows: readonly (readonly (string | number | null)[])[];
}

export type TableName = 'sheet' | 'elements' | 'cut-list' | 'bom';

const round = (v: number | null | undefined): number | null =>
  v === null || v === undefined || !Number.isFinite(v) ? null : Number(v.toPrecision(6));

/** The element table: every element with its check, as the sketcher lists it. */
export function elementTable(doc: SpoolDocument, check: SpoolCheck): Table {
  const u = UNIT_LABELS[doc.units];
  const fields = [
    '#',
    'element',
    'kind',
    'NPS',
    'schedule',
    `length (${u.length})`,
    'angle (deg)',
    `outside diameter (${u.length})`,
    `nominal wall (${u.length})`,
    `ordered wall needed (${u.length})`,
    'margin (%)',
    'governing case',
    `MAWP (${u.pressure})`,
    'lightest schedule',
    `wall before bending (${u.length})`,
    'check',
  ];
  const rows = doc.elements.map((el, i) => {
    const c = check.elements[i];
    const ok = c !== undefined && c.status !== 'invalid';
    return [
      i + 1,
      el.id,
      el.kind,
      el.nps !== undefined ? String(el.nps) : null,
      el.schedule !== undefined ? String(el.schedule) : null,
      el.kind === 'straight' ? round(el.length) : null,
      el.kind === 'bend' ? round(el.angle) : null,
      ok ? round(c.outsideDiameter) : null,
      ok ? round(c.nominalWall) : null,
      ok ? round(c.requiredNominalWall) : null,
      ok && c.margin !== null ? round(c.margin * 100) : null,
      c?.governing ?? null,
      ok ? round(c.mawp) : null,
      c?.lightestSchedule ?? null,
      ok && c.preBendWall !== undefined ? round(c.preBendWall) : null,
      c?.status ?? 'invalid',
    ];
  });
  return { fields, rows };
}

/** The fabrication sheet per element (the JSON `elements` flattened): order, cut, mass and the bend figures. */
export function sheetTable(sheet: FabricationSheet): Table {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  const fields = [
    'element',
    'kind',
    'NPS',
    'schedule',
    'order schedule',
    `order wall (${u.length})`,
    `cut length (${u.length})`,
    `mass (${m.mass})`,
    'bend angle (deg)',
    `bend radius (${u.length})`,
    'R/D',
    'table factor',
    `wall before bending (${u.length})`,
    `extrados wall after bending (${u.length})`,
    `intrados wall after bending (${u.length})`,
    'order heavier',
    `arc length (${u.length})`,
    `bend tangent R·tan(θ/2) (${u.length})`,
  ];
  const rows = sheet.elements.map((e) => {
    const b = e.bend;
    return [
      e.id,
      e.kind,
      e.nps,
      e.schedule,
      e.orderSchedule,
      round(e.orderWall),
      round(e.cutLength),
      round(e.mass),
      b ? round(b.angle) : null,
      b ? round(b.radius) : null,
      b ? round(b.radiusOverD) : null,
      b ? round(b.tableFactor) : null,
      b ? round(b.wallBeforeBending) : null,
      b ? round(b.extradosWallAfter) : null,
      b ? round(b.intradosWallAfter) : null,
      b ? (b.orderHeavier ? 'yes' : 'no') : null,
      b ? round(b.arcLength) : null,
      b ? round(b.tangent) : null,
    ];
  });
  return { fields, rows };
}

/** The cut list: one row per piece (straights and bend pipe), with end preparation. */
export function cutListTable(sheet: FabricationSheet): Table {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  const fields = [
    'element',
    'kind',
    'NPS',
    'order schedule',
    `order wall (${u.length})`,
    'material',
    `cut length (${u.length})`,
    `tangent before (${u.length})`,
    `tangent after (${u.length})`,
    'bend angle (deg)',
    `bend radius (${u.length})`,
    `arc length (${u.length})`,
    `bend tangent R·tan(θ/2) (${u.length})`,
    `bending tangent per end (${u.length})`,
    'end 1 preparation',
    'end 2 preparation',
    `mass (${m.mass})`,
  ];
  const rows = sheet.elements.map((e) => [
    e.id,
    e.kind,
    e.nps,
    e.orderSchedule,
    round(e.orderWall),
    e.material,
    round(e.cutLength),
    e.kind === 'straight' ? round(e.tangentBefore) : null,
    e.kind === 'straight' ? round(e.tangentAfter) : null,
    e.bend ? round(e.bend.angle) : null,
    e.bend ? round(e.bend.radius) : null,
    e.bend ? round(e.bend.arcLength) : null,
    e.bend ? round(e.bend.tangent) : null,
    e.bend ? round(e.bend.bendingTangent) : null,
    e.ends[0].text,
    e.ends[1].text,
    round(e.mass),
  ]);
  return { fields, rows };
}

/** The bill of materials: pipe to order by NPS, schedule as ordered and material. */
export function bomTable(sheet: FabricationSheet): Table {
  const u = UNIT_LABELS[sheet.units];
  const m = MASS_LABELS[sheet.units];
  const fields = [
    'NPS',
    `outside diameter (${u.length})`,
    'schedule (as ordered)',
    `wall (${u.length})`,
    'material',
    'pieces',
    `length to order (${u.length})`,
    `mass per length (${m.massPerRun})`,
    `mass (${m.mass})`,
    'elements',
  ];
  const rows = sheet.bom.map((b) => [
    b.nps,
    round(b.outsideDiameter),
    b.schedule,
    round(b.wall),
    b.material,
    b.pieces,
    round(b.length),
    round(b.massPerRun),
    round(b.mass),
    b.elements.join(' '),
  ]);
  return { fields, rows };
}

/** CSV text of a table; text cells that a spreadsheet would run as formulas are neutralised. */
export function tableToCsv(table: Table): string {
  return `${Papa.unparse({ fields: table.fields.map(String), data: table.rows.map((r) => neutraliseRow(r)) }, { newline: '\n' })}\n`;
}

/** File name naming the spool and revision, e.g. "CW-101-rev2-cut-list.csv". */
export function csvFileName(
  spoolName: string | null | undefined,
  revision: number | null | undefined,
  table: TableName,
): string {
  const slug = (spoolName ?? '').replace(/[^\w.-]+/g, '-').replace(/^-+|-+$/g, '') || 'spool';
  return `${slug}${revision !== null && revision !== undefined ? `-rev${revision}` : ''}-${table}.csv`;
}
