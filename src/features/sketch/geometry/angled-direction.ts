import { DIRECTIONS, type Direction, type Heading } from '@shared/model/spool';
import { DIRECTION_VECTORS, add, dot, normalize, scale, vecToHeading, type Vec3 } from './vec';

/*
 * A leg direction off the six axes, given as the drafter thinks of it: start on one axis
 * (`from`), swing toward a perpendicular axis (`toward`) by `angle` — "45° from east toward
 * north" — and optionally roll that swing plane about `from` toward a third axis by `roll` —
 * "45° from east toward north, rolled 30° toward up" is a rolled offset.
 *
 *   t' = cos(roll)·toward + sin(roll)·rollToward
 *   dir = cos(angle)·from + sin(angle)·t'
 */

export interface AngledDirectionInput {
  readonly from: Direction;
  readonly toward: Direction;
  /** Degrees, 0 < angle < 180. */
  readonly angle: number;
  /** Third axis, perpendicular to both `from` and `toward` (only needed with a roll). */
  readonly rollToward?: Direction;
  /** Degrees, 0 ≤ roll ≤ 90 (default 0). */
  readonly roll?: number;
}

export type AngledField = 'from' | 'toward' | 'angle' | 'rollToward' | 'roll';
export interface AngledIssue {
  readonly field: AngledField;
  readonly message: string;
}

export type AngledDirectionResult =
  | { ok: true; dir: Vec3; heading: Heading; description: string }
  | { ok: false; issues: AngledIssue[] };

const isDirection = (v: unknown): v is Direction => (DIRECTIONS as readonly unknown[]).includes(v);
const perpendicular = (a: Direction, b: Direction) =>
  Math.abs(dot(DIRECTION_VECTORS[a], DIRECTION_VECTORS[b])) < 1e-9;
const perpendicularChoices = (...to: Direction[]) =>
  DIRECTIONS.filter((d) => to.every((t) => perpendicular(d, t)));
const list = (ds: readonly string[]) =>
  ds.length <= 1 ? (ds[0] ?? '') : `${ds.slice(0, -1).join(', ')} or ${ds[ds.length - 1]}`;
const fmtDeg = (v: number) => `${Math.round(v * 1000) / 1000}°`;

/** Validate an angled direction and compute its unit vector; issues name the field. */
export function angledDirection(input: AngledDirectionInput): AngledDirectionResult {
  const issues: AngledIssue[] = [];
  const { from, toward, angle } = input;
  const roll = input.roll ?? 0;
  if (!isDirection(from))
    issues.push({ field: 'from', message: 'choose one of the six axis directions' });
  if (!isDirection(toward))
    issues.push({ field: 'toward', message: 'choose one of the six axis directions' });
  else if (isDirection(from) && !perpendicular(from, toward))
    issues.push({
      field: 'toward',
      message: `must be perpendicular to ${from}: choose ${list(perpendicularChoices(from))}`,
    });
  if (!(typeof angle === 'number' && Number.isFinite(angle)))
    issues.push({ field: 'angle', message: 'must be a number' });
  else if (!(angle > 0 && angle < 180))
    issues.push({ field: 'angle', message: 'must be more than 0° and less than 180°' });
  if (!(typeof roll === 'number' && Number.isFinite(roll)))
    issues.push({ field: 'roll', message: 'must be a number' });
  else if (!(roll >= 0 && roll <= 90))
    issues.push({ field: 'roll', message: 'must be from 0° to 90°' });
  else if (roll > 0) {
    const rt = input.rollToward;
    if (!isDirection(rt))
      issues.push({ field: 'rollToward', message: 'must be chosen for a roll above 0°' });
    else if (
      isDirection(from) &&
      isDirection(toward) &&
      (!perpendicular(rt, from) || !perpendicular(rt, toward))
    )
      issues.push({
        field: 'rollToward',
        message: `must be perpendicular to ${from} and ${toward}: choose ${list(perpendicularChoices(from, toward))}`,
      });
  }
  if (issues.length > 0) return { ok: false, issues };

  const rad = Math.PI / 180;
  const f = DIRECTION_VECTORS[from];
  let t = DIRECTION_VECTORS[toward];
  if (roll > 0 && input.rollToward)
    t = add(
      scale(t, Math.cos(roll * rad)),
      scale(DIRECTION_VECTORS[input.rollToward], Math.sin(roll * rad)),
    );
  const dir = normalize(add(scale(f, Math.cos(angle * rad)), scale(t, Math.sin(angle * rad))));
  const description =
    `${fmtDeg(angle)} from ${from} toward ${toward}` +
    (roll > 0 && input.rollToward ? `, rolled ${fmtDeg(roll)} toward ${input.rollToward}` : '');
  return { ok: true, dir, heading: vecToHeading(dir), description };
}

/** Describe a unit direction for people: an axis name, or its east/north/up components. */
export function describeDirection(dir: Vec3): string {
  const h = vecToHeading(dir);
  const parts: string[] = [];
  const add1 = (v: number, pos: string, neg: string) => {
    if (Math.abs(v) < 1e-9) return;
    parts.push(`${v > 0 ? pos : neg} ${Math.round(Math.abs(v) * 1000) / 1000}`);
  };
  add1(h.east, 'E', 'W');
  add1(h.north, 'N', 'S');
  add1(h.up, 'Up', 'Down');
  return parts.join(' · ');
}
