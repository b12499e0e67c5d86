import { eq } from 'drizzle-orm';
import { z } from 'zod';
import type { Db } from '../db/client';
import { teamMaterials } from '../db/schema';
import {
  MATERIALS,
  createMaterialLookup,
  findMaterial,
  type Material,
} from '../../shared/data/materials';
import type { MaterialFinder } from '../../shared/engine/index';
import { PRODUCT_FORMS } from '../../shared/model/spool';
import type { CsvRow } from '../csv';
import type { CsvIssue } from '../spools/line-list';
import type { MaterialsRef } from '../checks/check-task';
import { TEXT_LIMITS, text } from '../../shared/model/fields';

/**
 * Per-team material lookups (team rows first, then the library), built once per team and
 * rebuilt after an upload or delete in this process.
 */
export class TeamMaterials {
  private readonly cache = new Map<
    string,
    Promise<{ rows: TeamMaterialRow[]; find: MaterialFinder; ref: MaterialsRef }>
  >();
  private loads = 0;
  constructor(private readonly db: Db) {}

  private load(teamId: string) {
    let p = this.cache.get(teamId);
    if (!p) {
      const key = `${teamId}#${++this.loads}`;
      p = this.db
        .select()
        .from(teamMaterials)
        .where(eq(teamMaterials.teamId, teamId))
        .then((rows) => ({
          rows: rows.map((r) => ({
            ...r.material,
            origin: 'team' as const,
            sourceNote: r.sourceNote,
            updatedAt: r.updatedAt.toISOString(),
          })),
          find:
            rows.length === 0 ? findMaterial : createMaterialLookup(rows.map((r) => r.material)),
          ref: { key, rows: rows.length === 0 ? null : rows.map((r) => r.material) },
        }));
      p.catch(() => this.cache.delete(teamId));
      this.cache.set(teamId, p);
    }
    return p;
  }

  async finder(teamId: string | null | undefined): Promise<MaterialFinder> {
    if (!teamId) return findMaterial;
    return (await this.load(teamId)).find;
  }

  /** The team's materials as the check pool's workers take them (null team: the library alone). */
  async ref(teamId: string | null | undefined): Promise<MaterialsRef> {
    if (!teamId) return { key: 'library', rows: null };
    return (await this.load(teamId)).ref;
  }

  /** Team rows (marked `origin: 'team'`), then library rows they do not replace. */
  async list(teamId: string) {
    const { rows } = await this.load(teamId);
    const ids = new Set(rows.map((r) => r.id));
    return [
      ...rows,
      ...MATERIALS.filter((m) => !ids.has(m.id)).map((m) => ({ ...m, origin: 'library' as const })),
    ];
  }

  invalidate(teamId: string) {
    this.cache.delete(teamId);
  }
}

export type TeamMaterialRow = Material & { origin: 'team'; sourceNote: string; updatedAt: string };

const key = (h: string) => h.toLowerCase().replace(/[\s_\-()]/g, '');
const COLUMNS = [
  'id',
  'spec',
  'grade',
  'name',
  'category',
  'yfamily',
  'wfamily',
  'modulusgroup',
  'productforms',
  'tensileksi',
  'yieldksi',
  'tempf',
  'stressksi',
  'yieldatksi',
  'frommemory',
] as const;
const REQUIRED = ['id', 'spec', 'grade', 'tensileksi', 'yieldksi', 'tempf', 'stressksi'];

const num = (label: string) =>
  z
    .string()
    .regex(/^[-+]?(\d+\.?\d*|\.\d+)$/, `${label} must be a number`)
    .transform(Number);
const materialColumns = z.object({
  spec: text(TEXT_LIMITS.id, { min: 1 }),
  grade: text(TEXT_LIMITS.id, { min: 1 }),
  name: text(TEXT_LIMITS.name).optional(),
  category: z
    .enum(['carbon', 'low-temp-carbon', 'cr-mo', 'austenitic', 'other'])
    .optional()
    .default('other'),
  yfamily: z
    .enum(['ferritic', 'austenitic', 'nickel', 'gray-iron', 'other'])
    .optional()
    .default('ferritic'),
  wfamily: z
    .enum(['carbon', 'cr-mo', 'csef', 'austenitic', 'nickel', 'none'])
    .optional()
    .default('carbon'),
  modulusgroup: z
    .enum(['carbon', 'cr-mo-low', 'cr-mo-2-1/4', 'cr-mo-5-9', 'austenitic'])
    .optional()
    .default('carbon'),
  productforms: z
    .string()
    .optional()
    .transform((s, ctx) => {
      const forms = (s ?? 'seamless')
        .split(/[;|]/)
        .map((f) => f.trim())
        .filter(Boolean);
      const bad = forms.find((f) => !(PRODUCT_FORMS as readonly string[]).includes(f));
      if (bad) {
        ctx.addIssue({
          code: 'custom',
          message: `unknown product form "${bad}" (use ${PRODUCT_FORMS.join(', ')}; separate with ;)`,
        });
        return z.NEVER;
      }
      return forms as Material['productForms'];
    }),
  tensileksi: num('tensile_ksi').refine((v) => v > 0, 'must be greater than zero'),
  yieldksi: num('yield_ksi').refine((v) => v > 0, 'must be greater than zero'),
});
const pointColumns = z.object({
  tempf: num('temp_f').refine((v) => v >= -459 && v <= 2000, 'must be a temperature in °F'),
  stressksi: num('stress_ksi').refine(
    (v) => v > 0 && v < 200,
    'must be an allowable stress in ksi',
  ),
  yieldatksi: num('yield_at_ksi')
    .refine((v) => v > 0 && v < 300, 'must be a yield strength in ksi')
    .optional(),
  frommemory: z
    .string()
    .transform((s) => s.toLowerCase())
    .pipe(
      z.enum(['yes', 'no', 'true', 'false', '1', '0', 'y', 'n'], {
        error: 'from_memory must be yes or no',
      }),
    )
    .transform((s) => ['yes', 'true', '1', 'y'].includes(s))
    .optional(),
});

const issue = (line: number, column: string | null, message: string): CsvIssue => ({
  line,
  column,
  path: column ? `line ${line}: ${column}` : `line ${line}`,
  message,
});
const ksi = (v: number) => Math.round(v * 1000);

/**
 * Materials CSV: one row per material and temperature (`id, spec, grade, tensile_ksi, yield_ksi,
 * temp_f, stress_ksi`, optional `name, category, y_family, w_family, modulus_group,
 * product_forms, yield_at_ksi, from_memory` (yes/no: the row's values were recalled, not read
 * from the source)). Material columns are read from each id's first row.
 */
export function readMaterialsCsv(
  headers: readonly string[],
  rows: readonly CsvRow[],
  sourceNote: string,
): { materials: Material[]; issues: CsvIssue[] } {
  const issues: CsvIssue[] = [];
  const colOf = new Map<string, string>();
  for (const h of headers) {
    const k = key(h);
    if ((COLUMNS as readonly string[]).includes(k)) colOf.set(k, h);
    else issues.push(issue(1, h, `unknown column (use ${COLUMNS.join(', ')})`));
  }
  for (const r of REQUIRED)
    if (!colOf.has(r)) issues.push(issue(1, r, 'required column is missing'));
  if (rows.length === 0) issues.push(issue(2, null, 'the file has no data rows'));
  if (issues.length > 0) return { materials: [], issues };

  const get = (row: CsvRow, k: string) => {
    const h = colOf.get(k);
    const v = h === undefined ? undefined : row.values[h];
    return v === '' ? undefined : v;
  };
  const byId = new Map<string, { first: CsvRow; rows: CsvRow[] }>();
  for (const row of rows) {
    const id = get(row, 'id');
    if (!id) {
      issues.push(issue(row.line, colOf.get('id') ?? 'id', 'is required'));
      continue;
    }
    if (id.length > TEXT_LIMITS.id) {
      issues.push(issue(row.line, 'id', `must be at most ${TEXT_LIMITS.id} characters`));
      continue;
    }
    const g = byId.get(id);
    if (g) g.rows.push(row);
    else byId.set(id, { first: row, rows: [row] });
  }
  const materials: Material[] = [];
  for (const [id, g] of byId) {
    const pick = (ks: readonly string[]) =>
      Object.fromEntries(ks.map((k) => [k, get(g.first, k)]).filter(([, v]) => v !== undefined));
    const head = materialColumns.safeParse(
      pick([
        'spec',
        'grade',
        'name',
        'category',
        'yfamily',
        'wfamily',
        'modulusgroup',
        'productforms',
        'tensileksi',
        'yieldksi',
      ]),
    );
    if (!head.success)
      for (const iss of head.error.issues)
        issues.push(
          issue(
            g.first.line,
            colOf.get(String(iss.path[0] ?? '')) ?? String(iss.path[0] ?? ''),
            iss.message,
          ),
        );
    const stress: Material['stress'] = [];
    const yieldPts: NonNullable<Material['yield']> = [];
    const seen = new Set<number>();
    for (const row of g.rows) {
      const p = pointColumns.safeParse(
        Object.fromEntries(
          ['tempf', 'stressksi', 'yieldatksi', 'frommemory']
            .map((k) => [k, get(row, k)])
            .filter(([, v]) => v !== undefined),
        ),
      );
      if (!p.success) {
        for (const iss of p.error.issues)
          issues.push(
            issue(
              row.line,
              colOf.get(String(iss.path[0] ?? '')) ?? String(iss.path[0] ?? ''),
              iss.message,
            ),
          );
        continue;
      }
      if (seen.has(p.data.tempf)) {
        issues.push(
          issue(
            row.line,
            colOf.get('tempf') ?? 'temp_f',
            `temperature ${p.data.tempf} °F appears twice for ${id}`,
          ),
        );
        continue;
      }
      seen.add(p.data.tempf);
      const flag = p.data.frommemory ? { fromMemory: true as const } : {};
      stress.push({ tempF: p.data.tempf, value: ksi(p.data.stressksi), ...flag });
      if (p.data.yieldatksi !== undefined)
        yieldPts.push({ tempF: p.data.tempf, value: ksi(p.data.yieldatksi), ...flag });
    }
    if (!head.success) continue;
    stress.sort((a, b) => a.tempF - b.tempF);
    yieldPts.sort((a, b) => a.tempF - b.tempF);
    const h = head.data;
    materials.push({
      id,
      spec: h.spec,
      grade: h.grade,
      name: h.name ?? `${h.spec} ${h.grade}`,
      category: h.category,
      tensilePsi: ksi(h.tensileksi),
      yieldPsi: ksi(h.yieldksi),
      yFamily: h.yfamily,
      wFamily: h.wfamily,
      modulusGroup: h.modulusgroup,
      productForms: h.productforms,
      stress,
      ...(yieldPts.length > 0 ? { yield: yieldPts } : {}),
      source: `Team materials upload: ${sourceNote}`,
      notes: [
        `Uploaded by the team with the source note "${sourceNote}"; verify against that source.`,
      ],
    });
  }
  return { materials, issues };
}
