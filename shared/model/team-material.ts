/**
 * A team material entered through the form (one material, its allowable stress per
 * temperature) and how it becomes a library `Material`. The server route and the form share
 * this schema; the CSV upload builds the same `Material` shape (server/materials/team-materials.ts).
 */
import { z } from 'zod';
import type { Material } from '../data/materials';
import { PRODUCT_FORMS } from './spool';

export const MATERIAL_CATEGORIES = [
  'carbon',
  'low-temp-carbon',
  'cr-mo',
  'austenitic',
  'other',
] as const;
export const Y_FAMILIES = ['ferritic', 'austenitic', 'nickel', 'gray-iron', 'other'] as const;
export const W_FAMILIES = ['carbon', 'cr-mo', 'csef', 'austenitic', 'nickel', 'none'] as const;
export const MODULUS_GROUPS = [
  'carbon',
  'cr-mo-low',
  'cr-mo-2-1/4',
  'cr-mo-5-9',
  'austenitic',
] as const;

/** Material ids are what documents reference: letters, digits, `.`, `_`, `-`. */
export const MATERIAL_ID_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._-]{0,39}$/;

const ksiNumber = (what: string, max: number) =>
  z
    .number({ error: `must be a number (${what}, ksi)` })
    .finite()
    .gt(0, 'must be greater than zero')
    .lt(max, `must be below ${max} ksi`);

export const materialPointInputSchema = z.object({
  /** Design temperature of this row, °F. */
  tempF: z
    .number({ error: 'must be a temperature in °F' })
    .finite()
    .min(-459, 'must be above −459 °F')
    .max(2000, 'must be at most 2000 °F'),
  /** Basic allowable stress S at tempF, ksi. */
  stressKsi: ksiNumber('allowable stress', 200),
  /** Yield strength at tempF, ksi (optional). */
  yieldAtKsi: ksiNumber('yield strength', 300).optional(),
});

export const teamMaterialInputSchema = z
  .object({
    id: z
      .string({ error: 'is required' })
      .trim()
      .regex(
        MATERIAL_ID_PATTERN,
        'use 1–40 letters, digits, ".", "_" or "-", starting with a letter or digit',
      ),
    spec: z
      .string({ error: 'is required' })
      .trim()
      .min(1, 'is required')
      .max(80, 'must be at most 80 characters'),
    grade: z
      .string({ error: 'is required' })
      .trim()
      .min(1, 'is required')
      .max(40, 'must be at most 40 characters'),
    name: z.string().trim().max(120, 'must be at most 120 characters').optional(),
    category: z.enum(MATERIAL_CATEGORIES).default('other'),
    yFamily: z.enum(Y_FAMILIES).default('ferritic'),
    wFamily: z.enum(W_FAMILIES).default('carbon'),
    modulusGroup: z.enum(MODULUS_GROUPS).default('carbon'),
    productForms: z.array(z.enum(PRODUCT_FORMS)).min(1, 'pick at least one product form'),
    /** Specified minimum tensile strength, ksi. */
    tensileKsi: ksiNumber('tensile strength', 300),
    /** Specified minimum yield strength, ksi. */
    yieldKsi: ksiNumber('yield strength', 300),
    points: z
      .array(materialPointInputSchema)
      .min(1, 'give at least one temperature row')
      .max(60, 'at most 60 temperature rows'),
    /** Where the values come from (table, edition, document): required. */
    sourceNote: z
      .string({ error: 'is required' })
      .trim()
      .min(3, 'give the source of the values (table, edition, document), at least 3 characters')
      .max(500, 'must be at most 500 characters'),
    /** The values were recalled, not read from the source: every row is flagged. */
    fromMemory: z.boolean().default(false),
  })
  .superRefine((v, ctx) => {
    const seen = new Set<number>();
    v.points.forEach((p, i) => {
      if (seen.has(p.tempF))
        ctx.addIssue({
          code: 'custom',
          path: ['points', i, 'tempF'],
          message: `${p.tempF} °F appears twice`,
        });
      seen.add(p.tempF);
    });
    if (v.yieldKsi >= v.tensileKsi)
      ctx.addIssue({
        code: 'custom',
        path: ['yieldKsi'],
        message: 'must be below the tensile strength',
      });
  });
export type TeamMaterialInput = z.input<typeof teamMaterialInputSchema>;
export type TeamMaterialValues = z.output<typeof teamMaterialInputSchema>;

const psi = (ksi: number) => Math.round(ksi * 1000);

/** The library `Material` for a validated form entry (stresses stored in psi, rows by temperature). */
export function buildTeamMaterial(v: TeamMaterialValues): Material {
  const points = [...v.points].sort((a, b) => a.tempF - b.tempF);
  const flag = v.fromMemory ? { fromMemory: true as const } : {};
  const yieldPts = points
    .filter((p) => p.yieldAtKsi !== undefined)
    .map((p) => ({ tempF: p.tempF, value: psi(p.yieldAtKsi!), ...flag }));
  return {
    id: v.id,
    spec: v.spec,
    grade: v.grade,
    name: v.name || `${v.spec} ${v.grade}`,
    category: v.category,
    tensilePsi: psi(v.tensileKsi),
    yieldPsi: psi(v.yieldKsi),
    yFamily: v.yFamily,
    wFamily: v.wFamily,
    modulusGroup: v.modulusGroup,
    productForms: v.productForms,
    stress: points.map((p) => ({ tempF: p.tempF, value: psi(p.stressKsi), ...flag })),
    ...(yieldPts.length > 0 ? { yield: yieldPts } : {}),
    source: `Team material: ${v.sourceNote}${v.fromMemory ? ' (values from memory)' : ''}`,
    notes: [
      `Entered by the team with the source note "${v.sourceNote}"; verify against that source.`,
      ...(v.fromMemory
        ? ['The values were recalled from memory, not read from the source: verify before use.']
        : []),
    ],
  };
}

/** True when any stress or yield row of a material is flagged as recalled from memory. */
export function isFromMemory(m: Pick<Material, 'stress' | 'yield'>): boolean {
  return m.stress.some((p) => p.fromMemory) || (m.yield ?? []).some((p) => p.fromMemory);
}
