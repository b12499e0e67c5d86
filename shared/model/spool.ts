import { z } from 'zod';
import { TEXT_LIMITS, text } from './fields';

/**
 * The spool document: the one JSON shape that the sketcher edits, the server stores and the
 * headless checker reads. Lengths, pressures, stresses and temperatures are in the document's
 * unit system: `imperial` = in, psi, °F; `metric` = mm, MPa, °C. Unknown fields are ignored.
 */

export const UNIT_SYSTEMS = ['imperial', 'metric'] as const;
export const unitSystemSchema = z.enum(UNIT_SYSTEMS);
export type UnitSystem = z.infer<typeof unitSystemSchema>;

export const PRODUCT_FORMS = [
  'seamless',
  'erw',
  'efw-single',
  'efw-double',
  'efw-spot-rt',
  'efw-full-rt',
  'furnace-butt',
] as const;
export const productFormSchema = z.enum(PRODUCT_FORMS);
export type ProductForm = z.infer<typeof productFormSchema>;

export const END_TYPES = ['plain', 'bevel', 'threaded', 'grooved'] as const;
export const endTypeSchema = z.enum(END_TYPES);
export type EndType = z.infer<typeof endTypeSchema>;

/** The six axis directions of the isometric sketch. */
export const DIRECTIONS = ['north', 'south', 'east', 'west', 'up', 'down'] as const;
export const directionSchema = z.enum(DIRECTIONS);
export type Direction = z.infer<typeof directionSchema>;

/**
 * A general sketch direction, for legs drawn off the six axes (45° offsets, rolled legs):
 * its components along east, north and up. Any length but zero; readers normalise it.
 * An element with a `heading` runs along it; `direction` (an axis) is then absent or ignored.
 */
export const headingSchema = z
  .object({
    east: z
      .number({ error: 'must be a number' })
      .refine(Number.isFinite, 'must be a finite number'),
    north: z
      .number({ error: 'must be a number' })
      .refine(Number.isFinite, 'must be a finite number'),
    up: z.number({ error: 'must be a number' }).refine(Number.isFinite, 'must be a finite number'),
  })
  .refine((h) => Math.hypot(h.east, h.north, h.up) > 1e-9, 'must not be zero in every component');
export type Heading = z.infer<typeof headingSchema>;

const finite = () =>
  z.number({ error: 'must be a number' }).refine(Number.isFinite, 'must be a finite number');
const nonNegative = () => finite().refine((v) => v >= 0, 'must be zero or more');
const positive = () => finite().refine((v) => v > 0, 'must be greater than zero');

/** Design conditions; every field may be overridden per element. */
export const conditionsShape = {
  /** Internal design gauge pressure P (psi | MPa), ≥ 0. */
  pressure: nonNegative(),
  /** Design temperature (°F | °C). */
  temperature: finite(),
  /** External design pressure, differential (psi | MPa), ≥ 0. */
  externalPressure: nonNegative().optional(),
  /** Material library id or ASTM spec-grade, e.g. "A106-B", "A312-TP316L". */
  material: text(TEXT_LIMITS.id, { trim: true, min: 1 }).optional(),
  /** Allowable stress S override (psi | MPa); then material may be omitted. */
  allowableStress: positive().optional(),
  /** Quality factor E override (0 < E ≤ 1); else from productForm. */
  qualityFactor: positive()
    .refine((v) => v <= 1, 'must be at most 1')
    .optional(),
  /** Product form / longitudinal joint; sets E from B31.3 Table A-1B. Default seamless. */
  productForm: productFormSchema.optional(),
  /** Weld joint strength reduction factor W override (0 < W ≤ 1). */
  weldStrengthFactor: positive()
    .refine((v) => v <= 1, 'must be at most 1')
    .optional(),
  /** Coefficient Y override (0 ≤ Y < 1). */
  coefficientY: nonNegative()
    .refine((v) => v < 1, 'must be less than 1')
    .optional(),
  /** Yield strength Sy override for external pressure (psi | MPa). */
  yieldStrength: positive().optional(),
  /** Elastic modulus override for external pressure (psi | MPa). */
  elasticModulus: positive().optional(),
  /** Corrosion/erosion allowance (in | mm), default 0. */
  corrosionAllowance: nonNegative().optional(),
  /** Mill under-tolerance as a fraction of nominal wall, 0 ≤ tol < 1, default 0.125. */
  millTolerance: nonNegative()
    .refine((v) => v < 1, 'must be less than 1 (a fraction, e.g. 0.125)')
    .optional(),
  /** Fixed mill under-tolerance length (in | mm), e.g. 0.01 in for plate-formed pipe; replaces millTolerance. */
  millToleranceLength: nonNegative().optional(),
  /** Design length L between stiffening sections for external pressure (in | mm). */
  stiffenedLength: positive().optional(),
  /** Groove depth for grooved ends (in | mm). */
  grooveDepth: nonNegative().optional(),
} as const;

export const conditionsSchema = z.object(conditionsShape);
export type Conditions = z.infer<typeof conditionsSchema>;
export const conditionOverridesSchema = conditionsSchema.partial();
export type ConditionOverrides = z.infer<typeof conditionOverridesSchema>;

/** NPS as a trade designation ("1-1/2", "2", "1/2") or a number (1.5). */
export const npsSchema = z.union([text(TEXT_LIMITS.short, { trim: true, min: 1 }), positive()]);
export type NpsInput = z.infer<typeof npsSchema>;

/** Schedule designation: "40", "STD", "XS", "XXS", "10S" … */
export const scheduleSchema = z.union([
  text(TEXT_LIMITS.short, { trim: true, min: 1 }),
  positive().transform(String),
]);

/** Bend radius R1 of the pipe centreline: a length (in | mm) or a multiple of NPS-based D. */
export const bendRadiusSchema = z.union([positive(), z.object({ multipleOfD: positive() })]);
export type BendRadius = z.infer<typeof bendRadiusSchema>;

const elementBase = {
  /** Stable id, unique within the spool. */
  id: text(TEXT_LIMITS.id, { trim: true, min: 1 }),
  /** Nominal pipe size; with schedule, resolved from ASME B36.10M/B36.19M. */
  nps: npsSchema.optional(),
  schedule: scheduleSchema.optional(),
  /** Explicit outside diameter D (in | mm), instead of nps. */
  outsideDiameter: positive().optional(),
  /** Explicit inside diameter d (in | mm): straights then use the ID form, B31.3 Eq. (3b). */
  insideDiameter: positive().optional(),
  /** Explicit nominal wall T (in | mm), instead of schedule. */
  nominalWall: positive().optional(),
  /** Outgoing direction in the sketch (straights: run direction; bends: direction after the bend). */
  direction: directionSchema.optional(),
  /**
   * General outgoing direction (same meaning as `direction`, any angle); wins over `direction`.
   * A bend turns the incoming run toward it by `angle`: the bend lies in the plane of the
   * incoming direction and the heading.
   */
  heading: headingSchema.optional(),
  /** Per-element overrides of the spool conditions. */
  conditions: conditionOverridesSchema.optional(),
  /** Free-text tag shown on drawings. */
  tag: text(80).optional(),
};

export const straightSchema = z.object({
  ...elementBase,
  kind: z.literal('straight'),
  /** Cut length along the run (in | mm). */
  length: positive(),
  endType: endTypeSchema.optional(),
});
export type Straight = z.infer<typeof straightSchema>;

export const bendSchema = z.object({
  ...elementBase,
  kind: z.literal('bend'),
  bendRadius: bendRadiusSchema,
  /** Bend angle in degrees, 0 < angle ≤ 180. */
  angle: positive().refine((v) => v <= 180, 'must be at most 180 degrees'),
});
export type Bend = z.infer<typeof bendSchema>;

const withPipeSize = <
  T extends z.ZodType<{
    nps?: unknown;
    schedule?: unknown;
    outsideDiameter?: unknown;
    insideDiameter?: unknown;
    nominalWall?: unknown;
  }>,
>(
  s: T,
) =>
  s.superRefine((el, ctx) => {
    if (
      el.nps === undefined &&
      el.outsideDiameter === undefined &&
      el.insideDiameter === undefined
    ) {
      ctx.addIssue({
        code: 'custom',
        path: ['nps'],
        message: 'give nps (with schedule) or outsideDiameter',
      });
    }
    if (el.schedule === undefined && el.nominalWall === undefined) {
      ctx.addIssue({ code: 'custom', path: ['schedule'], message: 'give schedule or nominalWall' });
    }
  });

export const spoolElementSchema = withPipeSize(
  z.discriminatedUnion('kind', [straightSchema, bendSchema], {
    error: (iss) =>
      iss.code === 'invalid_union' ? 'kind must be "straight" or "bend"' : undefined,
  }),
);
export type SpoolElement = Straight | Bend;
export type ElementKind = SpoolElement['kind'];

export const pointSchema = z.object({ x: finite(), y: finite(), z: finite() });

/** Absolute zero in each unit system's temperature unit (physics, not a code table). */
export const ABSOLUTE_ZERO: Readonly<Record<UnitSystem, { value: number; label: string }>> = {
  imperial: { value: -459.67, label: '−459.67 °F' },
  metric: { value: -273.15, label: '−273.15 °C' },
};

/** Hydrotest temperature when the spool gives none: 70 °F / 21 °C (ambient shop test, common practice). */
export const DEFAULT_TEST_TEMPERATURE = { imperial: 70, metric: 21 } as const;

/**
 * Shop settings of the spool (fabrication sheet): both optional, with defaults.
 * `testTemperature`: metal temperature at the hydrotest (°F | °C), default 70 °F / 21 °C;
 * `bendTangent`: straight pipe the shop adds at each end of a bend for the bending machine
 * (in | mm), cut off after bending, default 0.
 */
export const shopSettingsSchema = z.object({
  testTemperature: finite().optional(),
  bendTangent: nonNegative().optional(),
});
export type ShopSettings = z.infer<typeof shopSettingsSchema>;

export const spoolDocumentSchema = z
  .object({
    units: unitSystemSchema,
    name: text(TEXT_LIMITS.name).optional(),
    /** Line number the spool belongs to (free text). */
    line: text(TEXT_LIMITS.short).optional(),
    conditions: conditionsSchema,
    /** Sketch origin of the first element (in | mm); default 0,0,0. */
    origin: pointSchema.optional(),
    /** Default bend radius for new bends in the sketcher. */
    defaultBendRadius: bendRadiusSchema.optional(),
    /** Shop settings for the fabrication sheet (test temperature, bending tangent). */
    shop: shopSettingsSchema.optional(),
    elements: z.array(spoolElementSchema).max(20_000, 'at most 20,000 elements'),
  })
  .superRefine((doc, ctx) => {
    const seen = new Map<string, number>();
    doc.elements.forEach((el, i) => {
      const prev = seen.get(el.id);
      if (prev !== undefined) {
        ctx.addIssue({
          code: 'custom',
          path: ['elements', i, 'id'],
          message: `duplicate id "${el.id}" (also elements[${prev}])`,
        });
      } else seen.set(el.id, i);
    });
    // Below absolute zero no table applies (B31.3 tables start far above it); a material's own
    // lower limit is the engine's to check, since it depends on the material looked up.
    const zero = ABSOLUTE_ZERO[doc.units];
    const cold = (t: number | undefined) => t !== undefined && t < zero.value;
    if (cold(doc.conditions.temperature))
      ctx.addIssue({
        code: 'custom',
        path: ['conditions', 'temperature'],
        message: `must be at or above absolute zero (${zero.label})`,
      });
    doc.elements.forEach((el, i) => {
      if (cold(el.conditions?.temperature))
        ctx.addIssue({
          code: 'custom',
          path: ['elements', i, 'conditions', 'temperature'],
          message: `must be at or above absolute zero (${zero.label})`,
        });
    });
    if (doc.conditions.material === undefined && doc.conditions.allowableStress === undefined) {
      const all = doc.elements.every(
        (el) =>
          el.conditions?.material !== undefined || el.conditions?.allowableStress !== undefined,
      );
      if (!all)
        ctx.addIssue({
          code: 'custom',
          path: ['conditions', 'material'],
          message: 'give material or allowableStress',
        });
    }
  });

/** A spool document as stored and checked (readonly by convention: edits make new documents). */
export interface SpoolDocument {
  readonly units: UnitSystem;
  readonly name?: string;
  readonly line?: string;
  readonly conditions: Conditions;
  readonly origin?: { x: number; y: number; z: number };
  readonly defaultBendRadius?: BendRadius;
  readonly shop?: ShopSettings;
  readonly elements: readonly SpoolElement[];
}

export const isBend = (el: SpoolElement): el is Bend => el.kind === 'bend';
export const isStraight = (el: SpoolElement): el is Straight => el.kind === 'straight';

/** Make a straight element. */
export function createStraight(props: Omit<Straight, 'kind'>): Straight {
  return { kind: 'straight', ...props };
}

/** Make a bend element. */
export function createBend(props: Omit<Bend, 'kind'>): Bend {
  return { kind: 'bend', ...props };
}

/** A validation problem with a field path such as `elements[2].bendRadius`. */
export interface FieldIssue {
  readonly path: string;
  readonly message: string;
}

/** Format a zod/JSON path as `elements[2].bendRadius`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else out += out === '' ? String(seg) : `.${String(seg)}`;
  }
  return out === '' ? '(document)' : out;
}

export type ParseResult = { ok: true; doc: SpoolDocument } | { ok: false; issues: FieldIssue[] };

/** Validate unknown JSON as a spool document; issues name each offending field. */
export function parseSpoolDocument(input: unknown): ParseResult {
  const r = spoolDocumentSchema.safeParse(input);
  if (r.success) return { ok: true, doc: r.data as SpoolDocument };
  return {
    ok: false,
    issues: r.error.issues.map((iss) => ({ path: formatPath(iss.path), message: iss.message })),
  };
}
