import type { ElementKind, FieldIssue, UnitSystem } from '../model/spool';
import type { ScheduleChoice } from '../data/pipe-dimensions';
import type { ExternalBasis } from './external';

export type { ScheduleChoice } from '../data/pipe-dimensions';
export type { ExternalBasis } from './external';

/** Result status of one element. `invalid`: inputs could not be resolved (see `inputIssues`). */
export type CheckStatus = 'pass' | 'marginal' | 'fail' | 'review' | 'invalid';
export type CaseName = 'straight' | 'intrados' | 'extrados' | 'sidewall' | 'external';

/** One input value with where it came from, in the document's units. */
export interface SourcedValue {
  /** Code symbol: P, D, S, E, W, Y, c, tol, L, Sy, Ey … */
  readonly symbol: string;
  readonly label: string;
  readonly value: number;
  /** Unit label in the document's unit system ('' for dimensionless). */
  readonly unit: string;
  /** Where the value came from: a table/paragraph/edition, the spool conditions, an override. */
  readonly source: string;
  /** True where the tabulated value is recalled from memory and must be verified. */
  readonly fromMemory?: boolean;
}

/** One equation of the trail, with its values substituted. */
export interface TrailStep {
  /** Equation id, e.g. "B31.3 Eq. (3a)". */
  readonly equation: string;
  /** What the step computes, e.g. "pressure design thickness t". */
  readonly label: string;
  /** Symbolic form, e.g. "t = P·D / (2·(S·E·W + P·Y))". */
  readonly formula: string;
  /** Formula with values substituted, e.g. "t = 285 × 2.375 / (2 × (20000 × 1 × 1 + 285 × 0.4))". */
  readonly substituted: string;
  readonly symbol: string;
  readonly value: number;
  readonly unit: string;
}

export interface CaseResult {
  readonly case: CaseName;
  /** Bend factor I (Eqs. 3d/3e), bends only. */
  readonly I?: number;
  /** Pressure design thickness t (length units). */
  readonly t: number;
  /** Minimum required thickness tm = t + c (length units). */
  readonly tm: number;
  /** Ordered nominal wall needed for this case: tm / (1 − tol) or tm + fixed under-tolerance. */
  readonly requiredNominalWall: number;
  /** External case: allowable external pressure of the chosen wall (pressure units): min(UG-28, VIII-2). */
  readonly allowablePressure?: number;
  /** External case: the chosen wall's UG-28 value (elastic 2·A·E/(3·Do/t); Do/t < 10 the UG-28(c)(2) rules) [from memory]. */
  readonly allowableUg28?: number;
  /** External case: the chosen wall's VIII-2 4.4.5.1 closed-form value [from memory]. */
  readonly allowableVIII2?: number;
  /** External case: which relation gives the chosen wall's allowable. */
  readonly allowableBasis?: ExternalBasis;
  /** External case: which relation governs at the minimum wall t. */
  readonly minimumWallBasis?: ExternalBasis;
  /** Equation id of the governing equation for t. */
  readonly equation: string;
  readonly trail: readonly TrailStep[];
}

export type MessageLevel = 'info' | 'warning' | 'error';
export interface CheckMessage {
  readonly level: MessageLevel;
  /** Stable machine code, e.g. "thick-wall", "tight-bend", "from-memory". */
  readonly code: string;
  readonly text: string;
}

/** Wall needed before bending (fabrication), bends only. */
export interface PreBendResult {
  /** R1/D used for the table (D = nominal pipe size, per B31.1 Table 102.4.5). */
  readonly radiusRatio: number;
  /** Interpolated table factor and the wall it gives (factor × tm of the governing case). */
  readonly tableFactor: number | null;
  readonly tableWall: number | null;
  /** Geometric estimate (neutral axis at centreline). */
  readonly extradosThinning: number;
  readonly intradosThickening: number;
  readonly expectedExtradosWall: number;
  readonly expectedIntradosWall: number;
  /** Wall needed before bending so the extrados keeps its required minimum wall. */
  readonly geometricWall: number;
  /** The larger of the table and geometric walls, as ordered nominal (with mill tolerance). */
  readonly requiredOrderedWall: number;
  /** True when the chosen schedule is lighter than the wall needed before bending. */
  readonly orderHeavier: boolean;
  /** Lightest schedule whose nominal wall meets requiredOrderedWall (null if none). */
  readonly orderSchedule: string | null;
  /** The same choice with every name of that wall and its standard (null if none). */
  readonly order: ScheduleChoice | null;
  readonly trail: readonly TrailStep[];
}

export interface ElementCheck {
  readonly id: string;
  readonly kind: ElementKind;
  readonly index: number;
  readonly status: CheckStatus;
  /** Chosen pipe (length units); NaN-free: 0 when invalid. */
  readonly outsideDiameter: number;
  readonly nominalWall: number;
  /** Nominal wall less mill under-tolerance. */
  readonly minimumWall: number;
  /** Max over cases of the ordered nominal wall needed. */
  readonly requiredNominalWall: number;
  /** (nominalWall − requiredNominalWall) / requiredNominalWall; negative when failing; null when nothing is required. */
  readonly margin: number | null;
  readonly governing: CaseName | null;
  /**
   * Lightest passing schedule of the element's own standard (B36.10M: 10…160, STD, XS, XXS;
   * B36.19M: 5S, 10S, 40S, 80S; stainless falls back to B36.10M walls). The first name only:
   * what "use it" sets. Offered for `review` elements too.
   */
  readonly lightestSchedule: string | null;
  /** The same choice with every name of that wall ("80 / XS") and its standard. */
  readonly lightest: ScheduleChoice | null;
  /** Maximum allowable internal working pressure of the chosen wall (pressure units). */
  readonly mawp: number;
  readonly preBendWall?: number;
  readonly preBend?: PreBendResult;
  readonly cases: readonly CaseResult[];
  readonly messages: readonly CheckMessage[];
  /** Inputs used, with sources (the trail's "where from"). */
  readonly inputs: readonly SourcedValue[];
  /** Input problems that made the element uncheckable (status `invalid`). */
  readonly inputIssues: readonly FieldIssue[];
}

export interface CheckSummary {
  readonly pass: number;
  readonly marginal: number;
  readonly fail: number;
  readonly review: number;
  readonly invalid: number;
}

export interface SpoolCheck {
  readonly units: UnitSystem;
  readonly elements: readonly ElementCheck[];
  readonly summary: CheckSummary;
  /** Worst status over the elements (invalid > fail > review > marginal > pass). */
  readonly worst: CheckStatus | null;
  readonly caution: string;
}

// ---------------------------------------------------------------------------------------------
// Numbers-only results (the fast path): the same numbers as the full results, no trail, no text.
// ---------------------------------------------------------------------------------------------

export type CaseFigures = Omit<CaseResult, 'trail'>;
export type PreBendFigures = Omit<PreBendResult, 'trail'>;

export interface ElementFigures {
  readonly id: string;
  readonly kind: ElementKind;
  readonly index: number;
  readonly status: CheckStatus;
  readonly outsideDiameter: number;
  readonly nominalWall: number;
  readonly minimumWall: number;
  readonly requiredNominalWall: number;
  readonly margin: number | null;
  readonly governing: CaseName | null;
  readonly lightestSchedule: string | null;
  readonly lightest: ScheduleChoice | null;
  readonly mawp: number;
  readonly preBendWall?: number;
  readonly preBend?: PreBendFigures;
  readonly cases: readonly CaseFigures[];
  /** The message codes of the full result, each once, in order of first appearance. */
  readonly codes: readonly string[];
}

export interface SpoolFigures {
  readonly units: UnitSystem;
  readonly elements: readonly ElementFigures[];
  readonly summary: CheckSummary;
  readonly worst: CheckStatus | null;
  readonly caution: string;
}
