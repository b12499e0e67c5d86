import {
  createBend,
  type Bend,
  type BendRadius,
  type SpoolDocument,
  type SpoolElement,
  type Straight,
} from '@shared/model/spool';
import { UNIT_LABELS } from '@shared/units/units';
import { FALLBACK_BEND_RADIUS, bendTangent } from '../geometry/pipe-size';
import { buildSpoolPath } from '../geometry/spool-path';
import {
  add,
  angleBetweenDeg,
  directionOf,
  dot,
  normalize,
  scale,
  elementDirection,
  norm,
  sub,
  vecToHeading,
  type Vec3,
} from '../geometry/vec';

/*
 * The run as legs and corners, the form in which the store edits a spool's structure.
 * A leg is a run of straights in one direction; a corner joins two legs and holds the bend
 * (or null where a document changes direction without one). Each straight carries its
 * "work" length: its cut length plus the tangent R·tan(θ/2) of a bend at either end of its
 * leg. Structural edits keep work lengths (centreline intersection to intersection) and
 * recompute the cut lengths, so a leg keeps its drawn length when a bend radius changes,
 * and a change of direction that merges two legs keeps their sum.
 */

export interface Leg {
  /** Unit direction of the leg. */
  dir: Vec3;
  pieces: Straight[];
  /** Work length of each piece (document units). */
  work: number[];
  /** Set by an edit that emptied the leg: the leg is removed and its corners merged. */
  collapse?: boolean;
}

export interface Run {
  legs: Leg[];
  /** corners[i] joins legs[i] and legs[i + 1]. */
  corners: (Bend | null)[];
}

export type EditResult = { ok: true } | { ok: false; message: string };

/** What serialising needs besides the run: the document, new ids, and a bend template. */
export interface RunContext {
  readonly doc: SpoolDocument;
  nextId(prefix: 'S' | 'B'): string;
  /** Ids created by the current edit (messages talk about "this leg" for them). */
  readonly newIds: ReadonlySet<string>;
  /** Message for a reversal. */
  readonly doubleBackMessage?: string;
}

export const DOUBLE_BACK_MESSAGE = 'a leg cannot double back on the previous one';
const EPS = 1e-6;

/** Format a length for messages: up to 3 decimals, trailing zeros dropped. */
export function formatLength(value: number, doc: SpoolDocument): string {
  const rounded = Math.round(value * 1000) / 1000;
  return `${rounded} ${UNIT_LABELS[doc.units].length}`;
}

const roundLength = (v: number) => Math.round(v * 1e6) / 1e6;

const tangentOf = (bend: Bend | null | undefined, doc: SpoolDocument) =>
  bend ? bendTangent(bend, doc.units) : 0;

/** Split a document's elements into legs and corners. */
export function parseRun(doc: SpoolDocument): Run {
  const path = buildSpoolPath(doc);
  const legs: Leg[] = [];
  const corners: (Bend | null)[] = [];
  let prev: SpoolElement | undefined;
  for (const seg of path.segments) {
    if (seg.kind === 'straight') {
      const leg = legs[legs.length - 1];
      if (!leg) legs.push({ dir: seg.dir, pieces: [seg.element], work: [] });
      else if (leg.pieces.length === 0) {
        leg.dir = seg.dir;
        leg.pieces.push(seg.element);
      } else if (prev?.kind === 'straight' && angleBetweenDeg(leg.dir, seg.dir) > EPS) {
        // A change of direction without a bend (hand-made document).
        corners.push(null);
        legs.push({ dir: seg.dir, pieces: [seg.element], work: [] });
      } else leg.pieces.push(seg.element);
    } else {
      if (legs.length === 0) legs.push({ dir: seg.dirIn, pieces: [], work: [] });
      corners.push(seg.element);
      legs.push({ dir: seg.dirOut, pieces: [], work: [] });
    }
    prev = seg.element;
  }
  legs.forEach((leg, i) => {
    const before = tangentOf(corners[i - 1], doc);
    const after = tangentOf(corners[i], doc);
    leg.work = leg.pieces.map(
      (p, j) => p.length + (j === 0 ? before : 0) + (j === leg.pieces.length - 1 ? after : 0),
    );
  });
  return { legs, corners };
}

/** Find where an element sits in a run. */
export function locate(
  run: Run,
  id: string,
): { kind: 'piece'; leg: number; piece: number } | { kind: 'corner'; corner: number } | undefined {
  for (let i = 0; i < run.legs.length; i++) {
    const j = run.legs[i]!.pieces.findIndex((p) => p.id === id);
    if (j >= 0) return { kind: 'piece', leg: i, piece: j };
  }
  const c = run.corners.findIndex((b) => b?.id === id);
  return c >= 0 ? { kind: 'corner', corner: c } : undefined;
}

/** The spool's default radius for new bends. */
export function defaultBendRadius(doc: SpoolDocument): BendRadius {
  return doc.defaultBendRadius ?? FALLBACK_BEND_RADIUS;
}

/**
 * An element pointed along `dir`: an axis `direction` when `dir` is on an axis, else a
 * `heading` (the other key removed). The same object when it already points that way, so
 * unchanged elements keep their identity (the memoising checker relies on it).
 */
export function orient<T extends SpoolElement>(el: T, dir: Vec3): T {
  const axis = directionOf(dir);
  const current = elementDirection(el);
  const same = current !== undefined && norm(sub(current, dir)) < 1e-9;
  if (axis) {
    if (same && el.direction === axis && el.heading === undefined) return el;
    const { heading: _h, ...rest } = el;
    return { ...rest, direction: axis } as T;
  }
  if (same && el.heading !== undefined) return el;
  const { direction: _d, ...rest } = el;
  return { ...rest, heading: vecToHeading(dir) } as T;
}

/**
 * Where a bend stated as `bend` leaves a run coming in along `u` (as the path draws it): its
 * heading/direction projected square to `u`, turned by its angle. Undefined without a usable
 * direction.
 */
function bendExit(bend: Bend, u: Vec3): Vec3 | undefined {
  const h = elementDirection(bend);
  if (!h) return undefined;
  const perp = sub(h, scale(u, dot(h, u)));
  if (norm(perp) < 1e-6) return undefined;
  const t = normalize(perp);
  const theta = (bend.angle * Math.PI) / 180;
  return normalize(add(scale(u, Math.cos(theta)), scale(t, Math.sin(theta))));
}

function newBend(
  ctx: RunContext,
  template: SpoolElement | undefined,
  angle: number,
  dir: Vec3,
): Bend {
  const bend = createBend({
    id: ctx.nextId('B'),
    ...(template?.nps !== undefined ? { nps: template.nps } : {}),
    ...(template?.schedule !== undefined ? { schedule: template.schedule } : {}),
    ...(template?.outsideDiameter !== undefined
      ? { outsideDiameter: template.outsideDiameter }
      : {}),
    ...(template?.nominalWall !== undefined ? { nominalWall: template.nominalWall } : {}),
    bendRadius: defaultBendRadius(ctx.doc),
    angle,
  });
  return orient(bend, dir);
}

/**
 * Normalise a run after an edit and turn it back into elements: drop emptied legs, merge
 * legs that now run the same way, give every change of direction a bend with the right
 * angle, refuse reversals, and recompute cut lengths from work lengths (refusing any that
 * would be zero or less).
 */
export function serializeRun(
  run: Run,
  ctx: RunContext,
): { ok: true; elements: SpoolElement[] } | { ok: false; message: string } {
  const legs = run.legs.map((l) => ({ ...l, pieces: [...l.pieces], work: [...l.work] }));
  const corners = [...run.corners];
  const doc = ctx.doc;

  // 1. Remove legs an edit emptied.
  for (let k = 0; k < legs.length; ) {
    const leg = legs[k]!;
    if (!(leg.collapse && leg.pieces.length === 0)) {
      k++;
      continue;
    }
    if (legs.length === 1) {
      legs.splice(0, 1);
    } else if (k === 0) {
      legs.splice(0, 1);
      corners.splice(0, 1);
    } else if (k === legs.length - 1) {
      legs.splice(k, 1);
      corners.splice(k - 1, 1);
    } else {
      const keep = corners[k - 1] ?? corners[k] ?? null;
      legs.splice(k, 1);
      corners.splice(k - 1, 2, keep);
    }
  }

  // 2. Corners: merge same-direction legs, refuse reversals, set bend angles.
  for (let i = 0; i < corners.length; ) {
    const a = legs[i]!;
    const b = legs[i + 1]!;
    const angle = angleBetweenDeg(a.dir, b.dir);
    if (angle < EPS) {
      legs.splice(i, 2, {
        dir: a.dir,
        pieces: [...a.pieces, ...b.pieces],
        work: [...a.work, ...b.work],
      });
      corners.splice(i, 1);
      continue;
    }
    if (angle > 180 - EPS)
      return { ok: false, message: ctx.doubleBackMessage ?? DOUBLE_BACK_MESSAGE };
    const rounded = Math.round(angle * 1e6) / 1e6;
    const bend = corners[i];
    if (!bend) {
      corners[i] = newBend(ctx, a.pieces[a.pieces.length - 1] ?? b.pieces[0], rounded, b.dir);
    } else {
      // A bend that already leaves along the next leg keeps its stated direction (a
      // hand-made "45° toward north" stays as written).
      const exit = bend.angle === rounded ? bendExit(bend, a.dir) : undefined;
      if (!(exit && norm(sub(exit, b.dir)) < 1e-9)) {
        const turned = orient(bend, b.dir);
        corners[i] = turned.angle === rounded ? turned : { ...turned, angle: rounded };
      }
    }
    i++;
  }

  // 3. Cut lengths from work lengths.
  const elements: SpoolElement[] = [];
  for (let i = 0; i < legs.length; i++) {
    const leg = legs[i]!;
    const before = corners[i - 1] ?? null;
    const after = corners[i] ?? null;
    const tBefore = tangentOf(before, doc);
    const tAfter = tangentOf(after, doc);
    for (let j = 0; j < leg.pieces.length; j++) {
      const piece = leg.pieces[j]!;
      const need = (j === 0 ? tBefore : 0) + (j === leg.pieces.length - 1 ? tAfter : 0);
      const work = leg.work[j]!;
      const cut = roundLength(work - need);
      if (!(cut > EPS)) {
        const bends = [j === 0 ? before : null, j === leg.pieces.length - 1 ? after : null].filter(
          (b): b is Bend => b !== null,
        );
        const detail = bends
          .map((b) => `${b.id} ${formatLength(tangentOf(b, doc), doc)}`)
          .join(' + ');
        const what = ctx.newIds.has(piece.id)
          ? `this leg (${formatLength(work, doc)})`
          : `leg ${piece.id} (${formatLength(work, doc)})`;
        return {
          ok: false,
          message:
            `${what} is too short for ${bends.length > 1 ? 'the bends at its ends' : 'its bend'}: ` +
            `it must be longer than ${formatLength(need, doc)}, the tangent R·tan(θ/2) ${bends.length > 1 ? 'of both bends' : 'of the bend'} (${detail})`,
        };
      }
      // A straight right after a bend runs along the bend's exit; one with no stated
      // direction there keeps none rather than gaining a heading.
      const followsBend = j === 0 && before !== null;
      const unstated = piece.direction === undefined && piece.heading === undefined;
      const oriented =
        followsBend && unstated && directionOf(leg.dir) === undefined
          ? piece
          : orient(piece, leg.dir);
      const next = oriented.length === cut ? oriented : { ...oriented, length: cut };
      elements.push(next);
    }
    if (after) elements.push(after);
  }
  return { ok: true, elements };
}
