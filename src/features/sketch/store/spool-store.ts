import { createStore, type StoreApi } from 'zustand/vanilla';
import {
  bendRadiusSchema,
  conditionOverridesSchema,
  conditionsSchema,
  createStraight,
  directionSchema,
  endTypeSchema,
  headingSchema,
  npsSchema,
  scheduleSchema,
  shopSettingsSchema,
  spoolElementSchema,
  type BendRadius,
  type Conditions,
  type ConditionOverrides,
  type Direction,
  type EndType,
  type Heading,
  type NpsInput,
  type ShopSettings,
  type SpoolDocument,
  type SpoolElement,
} from '@shared/model/spool';
import {
  DIRECTION_VECTORS,
  add,
  angleBetweenDeg,
  dot,
  headingToVec,
  norm,
  normalize,
  scale,
  sub,
  type Vec3,
} from '../geometry/vec';
import {
  formatLength,
  locate,
  orient,
  parseRun,
  serializeRun,
  type EditResult,
  type Leg,
  type Run,
} from './run-model';

/*
 * The sketch editor store: one zustand store per open spool, built from four slices.
 *
 * - document: the immutable `SpoolDocument` and the actions that make new ones;
 * - selection: selected / hovered element ids (never enters history);
 * - history: `past` / `future` snapshots of the document. Every document change declares how
 *   it enters history (`HistoryMode`): `'immediate'` (default: one undo step per action),
 *   `'gesture'` (all changes until `endGesture()` make one step — for drags and sliders), or
 *   `'never'` (loading, server refresh). It also tracks the saved document (`isDirty`);
 * - view: canvas display settings and the "fit to spool" request (never enters history).
 *
 * Lengths are in the document's units (in | mm). Conventions shared with the geometry:
 * - a straight's `length` is its CUT length: the straight pipe between the tangent points of
 *   the bends at its ends (or the run's free end);
 * - a LEG is the straights between two changes of direction; its LEG LENGTH (what `addLeg`,
 *   `insertLegAfter` and `updateElement({ legLength })` take) is measured along the
 *   centreline from intersection point to intersection point (or the free end). Its cut
 *   length is the leg length less the tangent R·tan(θ/2) of the bend at each end.
 * - Structural edits (directions, bend radii, deletions) keep leg lengths and recompute cut
 *   lengths; an edit that would leave a cut length of zero or less is refused with a message.
 *
 * Check results are derived, never stored: see `useSpoolCheck()`.
 */

/** How a document change enters history. */
export type HistoryMode = 'immediate' | 'gesture' | 'never';

export interface ChangeOptions {
  /** Default `'immediate'`. */
  readonly history?: HistoryMode;
}

/** Pipe size used for new legs and bends. */
export interface DrawingPipe {
  readonly nps: NpsInput;
  readonly schedule: string;
}

/** Fields `updateElement` can change. `undefined` removes an optional field. */
export interface ElementPatch {
  /** Straights: cut length (> 0). */
  readonly length?: number;
  /** Straights: the leg length of the leg the straight belongs to (see conventions). */
  readonly legLength?: number;
  /** Straights: the straight's run direction (splits it off its leg when the leg has several straights). Bends: the direction after the bend (the whole following leg turns). */
  readonly direction?: Direction;
  /** As `direction`, any angle (east/north/up components); wins over `direction` when both are given. */
  readonly heading?: Heading;
  readonly nps?: NpsInput;
  readonly schedule?: string;
  readonly outsideDiameter?: number;
  readonly insideDiameter?: number;
  readonly nominalWall?: number;
  /** Bends: R1 as a length or `{ multipleOfD }`. */
  readonly bendRadius?: BendRadius;
  /**
   * Bends: the bend angle (0 < angle < 180 degrees). The leg after the bend turns in the
   * bend's plane (the rest of the run moves with it; the next bend takes the new angle
   * between its legs); the leg lengths stay.
   */
  readonly angle?: number;
  /** Per-element overrides, merged; a key set to undefined is removed; `null` clears all. */
  readonly conditions?: Partial<ConditionOverrides> | null;
  /** Straights: end preparation. */
  readonly endType?: EndType;
  readonly tag?: string;
}

/** Canvas display settings (not part of the document or history). */
export type DimensionMode = 'auto' | 'all' | 'none';
export interface ViewSettings {
  /** `auto`: selected/hovered element plus up to 40 labels; `all`; `none`. */
  readonly showDimensions: DimensionMode;
  /** WebGL antialiasing; changing it recreates the canvas's GL context. */
  readonly antialias: boolean;
  /** Incremented by `requestFit()`; the canvas frames the spool when it changes. */
  readonly fitRequest: number;
  /** Set by `requestFocus()`: the canvas frames element `id` when `request` changes. */
  readonly focus: { readonly id: string; readonly request: number } | null;
}

/**
 * Where a new leg runs: one of the six axes, or a general heading (east/north/up components,
 * e.g. from `angledDirection`: "45° from east toward north").
 */
export type LegDirection = Direction | Heading;

export interface SpoolStoreState {
  // document slice
  /** The spool being edited (immutable; every edit makes a new object). */
  readonly doc: SpoolDocument;
  /** Pipe size for new legs and bends (not part of the document). */
  readonly drawingPipe: DrawingPipe;
  // selection slice
  readonly selectedId: string | null;
  readonly hoveredId: string | null;
  // history slice
  readonly past: readonly SpoolDocument[];
  readonly future: readonly SpoolDocument[];
  readonly canUndo: boolean;
  readonly canRedo: boolean;
  /** Document as last saved (or loaded); `isDirty` is `doc !== savedDoc`. */
  readonly savedDoc: SpoolDocument;
  /** Server version of `savedDoc` (null when never saved). */
  readonly savedVersion: number | null;
  readonly isDirty: boolean;
  // view slice
  readonly view: ViewSettings;

  /** Replace the document without history and clear history (opening a spool, server refresh). `version` marks it saved. */
  load(doc: SpoolDocument, version?: number | null): void;
  /** Replace the whole document as one undoable edit (importing a file); history and saved state are kept. */
  replaceDocument(doc: SpoolDocument, opts?: ChangeOptions): void;
  /** Merge design conditions; a key set to undefined is removed (required keys are kept). */
  setConditions(patch: Partial<Conditions>, opts?: ChangeOptions): EditResult;
  /** Set name and/or line number; an empty string removes the field. */
  setMeta(meta: { name?: string; line?: string }, opts?: ChangeOptions): void;
  /** Default radius for bends created from now on (existing bends keep theirs). */
  setDefaultBendRadius(radius: BendRadius, opts?: ChangeOptions): EditResult;
  /** Merge the shop settings (test temperature, bending tangent); a key set to undefined returns to its default. */
  setShopSettings(patch: Partial<ShopSettings>, opts?: ChangeOptions): EditResult;
  /** Pipe size for the next legs (no document change). */
  setDrawingPipe(pipe: DrawingPipe): void;
  /**
   * Start a new run: REMOVES all elements (undoable), sets the origin (default: keep) and the
   * pipe size for new legs. Use `setDrawingPipe` to change size mid-run instead.
   */
  startRun(
    run: { nps: NpsInput; schedule: string; origin?: { x: number; y: number; z: number } },
    opts?: ChangeOptions,
  ): EditResult;
  /**
   * Draw a leg of `length` (leg length, see conventions) in `direction` at the run's free end.
   * Same direction: a straight is added to the last leg. A turn inserts a bend with the
   * spool's default radius and the angle between the legs (90° between axes, 45° for a leg
   * "45° from east toward north" after an east leg; any angle and plane). Refused: a
   * reversal ("a leg cannot double back on the previous one"); a leg not longer than the
   * new bend's tangent R·tan(θ/2); a previous leg that would become too short.
   */
  addLeg(direction: LegDirection, length: number, opts?: ChangeOptions): EditResult;
  /**
   * Insert a leg right after element `id` (after a straight: at its far end, splitting its
   * leg if it is not the leg's last straight; after a bend: at the start of the following
   * leg). Bends are added or merged so the run stays coherent; the rest of the run moves.
   */
  insertLegAfter(
    id: string,
    direction: LegDirection,
    length: number,
    opts?: ChangeOptions,
  ): EditResult;
  /** Change one element; refusals (bad value, too-short leg, reversal) return a message. */
  updateElement(id: string, patch: ElementPatch, opts?: ChangeOptions): EditResult;
  /**
   * Delete an element. A straight: its leg shortens by its length; an emptied leg is removed
   * and the bends around it merge into one (or vanish when the legs either side now run the
   * same way; refused when they would reverse). A bend: only where it joins no change of
   * direction, or it ends the run.
   */
  deleteElement(id: string, opts?: ChangeOptions): EditResult;
  select(id: string | null): void;
  hover(id: string | null): void;
  /** Open a gesture explicitly; changes with any mode until `endGesture` make one undo step. */
  beginGesture(): void;
  /** Close the gesture: one history entry if the document changed. */
  endGesture(): void;
  undo(): void;
  redo(): void;
  /** Mark `savedDoc` (default: the current document) as saved at server `version`. */
  markSaved(version: number, savedDoc?: SpoolDocument): void;
  setShowDimensions(mode: DimensionMode): void;
  setAntialias(on: boolean): void;
  /** Ask the canvas to frame the whole spool ("fit to spool"). */
  requestFit(): void;
  /** Ask the canvas to zoom to element `id` (default: the selected one); refused when there is none. */
  requestFocus(id?: string): EditResult;
}

export type SpoolStore = StoreApi<SpoolStoreState>;

/** Most undo steps kept. */
export const HISTORY_LIMIT = 200;

/** A minimal valid imperial document (used when the store is created without one). */
export function createEmptyDocument(): SpoolDocument {
  return {
    units: 'imperial',
    name: 'Untitled spool',
    conditions: { pressure: 150, temperature: 100, material: 'A106-B' },
    elements: [],
  };
}

const DEFAULT_PIPE: DrawingPipe = { nps: '2', schedule: '40' };

function pipeFromDoc(doc: SpoolDocument): DrawingPipe {
  for (let i = doc.elements.length - 1; i >= 0; i--) {
    const el = doc.elements[i]!;
    if (el.nps !== undefined && el.schedule !== undefined)
      return { nps: el.nps, schedule: String(el.schedule) };
  }
  return DEFAULT_PIPE;
}

type Counters = { S: number; B: number };

/** Highest S/B id numbers in a document. */
function maxCounters(doc: SpoolDocument): Counters {
  const max: Counters = { S: 0, B: 0 };
  for (const el of doc.elements) {
    const m = /^([SB])(\d+)$/.exec(el.id);
    if (m) max[m[1] as 'S' | 'B'] = Math.max(max[m[1] as 'S' | 'B'], Number(m[2]));
  }
  return max;
}

const ok: EditResult = { ok: true };
const refuse = (message: string): EditResult => ({ ok: false, message });

/** Drop keys whose value is undefined. */
function compact<T extends object>(o: T): T {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as T;
}

function firstIssue(
  r: { success: boolean; error?: { issues: { message: string; path: PropertyKey[] }[] } },
  field: string,
): string {
  const iss = r.error?.issues[0];
  const inner = iss ? iss.path.map(String).join('.') : '';
  const path = inner === '' ? field : field === '' ? inner : `${field}.${inner}`;
  return `${path}: ${iss?.message ?? 'invalid value'}`;
}

const sameElements = (a: readonly SpoolElement[], b: readonly SpoolElement[]) =>
  a.length === b.length && a.every((el, i) => el === b[i]);

type SetState = StoreApi<SpoolStoreState>['setState'];
type GetState = StoreApi<SpoolStoreState>['getState'];

/** Selected / hovered ids that still exist in `doc` (others are cleared). */
function keepSelection(
  get: GetState,
  doc: SpoolDocument,
): Pick<SpoolStoreState, 'selectedId' | 'hoveredId'> {
  const { selectedId, hoveredId } = get();
  const has = (id: string | null) => id !== null && doc.elements.some((e) => e.id === id);
  return {
    selectedId: has(selectedId) ? selectedId : null,
    hoveredId: has(hoveredId) ? hoveredId : null,
  };
}

/** Selection slice: which element is selected / under the pointer. Never enters history. */
function createSelectionSlice(
  set: SetState,
  get: GetState,
): Pick<SpoolStoreState, 'selectedId' | 'hoveredId' | 'select' | 'hover'> {
  return {
    selectedId: null,
    hoveredId: null,
    select(id) {
      if (get().selectedId !== id) set({ selectedId: id });
    },
    hover(id) {
      if (get().hoveredId !== id) set({ hoveredId: id });
    },
  };
}

/** View slice: canvas display settings. Never enters history. */
function createViewSlice(
  set: SetState,
  get: GetState,
): Pick<
  SpoolStoreState,
  'view' | 'setShowDimensions' | 'setAntialias' | 'requestFit' | 'requestFocus'
> {
  return {
    view: { showDimensions: 'auto', antialias: false, fitRequest: 0, focus: null },
    setShowDimensions(mode) {
      set({ view: { ...get().view, showDimensions: mode } });
    },
    setAntialias(on) {
      set({ view: { ...get().view, antialias: on } });
    },
    requestFit() {
      set({ view: { ...get().view, fitRequest: get().view.fitRequest + 1 } });
    },
    requestFocus(id) {
      const target = id ?? get().selectedId;
      if (!target) return refuse('select an element first: the view zooms to it');
      if (!get().doc.elements.some((e) => e.id === target)) return refuse(`no element "${target}"`);
      const request = (get().view.focus?.request ?? 0) + 1;
      set({ view: { ...get().view, focus: { id: target, request } } });
      return ok;
    },
  };
}

type HistoryState = Pick<
  SpoolStoreState,
  | 'past'
  | 'future'
  | 'canUndo'
  | 'canRedo'
  | 'savedDoc'
  | 'savedVersion'
  | 'isDirty'
  | 'beginGesture'
  | 'endGesture'
  | 'undo'
  | 'redo'
  | 'markSaved'
>;

interface HistorySlice {
  readonly state: HistoryState;
  /** Put a new document in place, entering history as `mode` says. */
  commit(next: SpoolDocument, mode?: HistoryMode): void;
  /** History and saved state after a `load`. */
  reset(doc: SpoolDocument, version: number | null): Partial<SpoolStoreState>;
}

const historyFlags = (past: readonly SpoolDocument[], future: readonly SpoolDocument[]) => ({
  past,
  future,
  canUndo: past.length > 0,
  canRedo: future.length > 0,
});

/** History slice: past/future snapshots of the immutable document, gestures, saved state. */
function createHistorySlice(set: SetState, get: GetState, start: SpoolDocument): HistorySlice {
  // Document at the start of an open gesture.
  let gestureBase: SpoolDocument | null = null;
  return {
    commit(next, mode = 'immediate') {
      const s = get();
      if (next === s.doc) return;
      const base = { doc: next, isDirty: next !== s.savedDoc, ...keepSelection(get, next) };
      if (mode === 'never') {
        set(base);
        return;
      }
      if (mode === 'gesture' || gestureBase !== null) {
        if (gestureBase === null) gestureBase = s.doc;
        set(base);
        return;
      }
      set({ ...base, ...historyFlags([...s.past, s.doc].slice(-HISTORY_LIMIT), []) });
    },
    reset(doc, version) {
      gestureBase = null;
      return { savedDoc: doc, savedVersion: version, isDirty: false, ...historyFlags([], []) };
    },
    state: {
      ...historyFlags([], []),
      savedDoc: start,
      savedVersion: null,
      isDirty: false,
      beginGesture() {
        if (gestureBase === null) gestureBase = get().doc;
      },
      endGesture() {
        const base = gestureBase;
        gestureBase = null;
        const s = get();
        if (base === null || base === s.doc) return;
        set(historyFlags([...s.past, base].slice(-HISTORY_LIMIT), []));
      },
      undo() {
        get().endGesture();
        const s = get();
        const prev = s.past[s.past.length - 1];
        if (!prev) return;
        set({
          doc: prev,
          isDirty: prev !== s.savedDoc,
          ...historyFlags(s.past.slice(0, -1), [...s.future, s.doc]),
          ...keepSelection(get, prev),
        });
      },
      redo() {
        get().endGesture();
        const s = get();
        const next = s.future[s.future.length - 1];
        if (!next) return;
        set({
          doc: next,
          isDirty: next !== s.savedDoc,
          ...historyFlags([...s.past, s.doc], s.future.slice(0, -1)),
          ...keepSelection(get, next),
        });
      },
      markSaved(version, savedDoc) {
        const saved = savedDoc ?? get().doc;
        set({ savedDoc: saved, savedVersion: version, isDirty: get().doc !== saved });
      },
    },
  };
}

/**
 * Make a fresh editor store (one per open spool; each test makes its own).
 * @param initial the document to edit; loaded as saved, with empty history.
 */
export function createSpoolStore(initial?: SpoolDocument): SpoolStore {
  const start = initial ?? createEmptyDocument();
  // Element ids: S1, S2… for straights, B1, B2… for bends; the counters only rise until the
  // next `load`, so an id deleted in this session is never reused (undo can bring it back).
  let counters: Counters = maxCounters(start);

  return createStore<SpoolStoreState>()((set, get) => {
    const history = createHistorySlice(set, get, start);
    const commit = history.commit;

    /** Run a structural edit on the legs of the current document. */
    const editRun = (
      edit: (run: Run, newIds: Set<string>) => EditResult | void,
      opts: ChangeOptions | undefined,
      doubleBackMessage?: string,
    ): EditResult => {
      const doc = get().doc;
      const run = parseRun(doc);
      const newIds = new Set<string>();
      const saved = { ...counters };
      const refused = edit(run, newIds);
      if (refused && !refused.ok) {
        counters = saved;
        return refused;
      }
      const r = serializeRun(run, {
        doc,
        newIds,
        nextId: (prefix) => {
          const id = `${prefix}${++counters[prefix]}`;
          newIds.add(id);
          return id;
        },
        ...(doubleBackMessage ? { doubleBackMessage } : {}),
      });
      if (!r.ok) {
        counters = saved;
        return refuse(r.message);
      }
      if (!sameElements(r.elements, doc.elements))
        commit({ ...doc, elements: r.elements }, opts?.history);
      return ok;
    };

    const newStraight = (dir: Vec3, newIds: Set<string>) => {
      const pipe = get().drawingPipe;
      const id = `S${++counters.S}`;
      newIds.add(id);
      return orient(createStraight({ id, nps: pipe.nps, schedule: pipe.schedule, length: 1 }), dir);
    };

    /** The unit vector of a leg direction, or a refusal naming what is wrong with it. */
    const legVector = (direction: LegDirection): Vec3 | EditResult => {
      if (typeof direction === 'string') {
        if (!directionSchema.safeParse(direction).success)
          return refuse(`unknown direction "${String(direction)}"`);
        return DIRECTION_VECTORS[direction];
      }
      const r = headingSchema.safeParse(direction);
      if (!r.success) return refuse(firstIssue(r, 'heading'));
      return headingToVec(r.data);
    };
    const isRefusal = (v: Vec3 | EditResult): v is EditResult => 'ok' in v;

    const checkLength = (length: number, what: string): EditResult | undefined =>
      Number.isFinite(length) && length > 0
        ? undefined
        : refuse(`${what} must be greater than zero`);

    return {
      ...createSelectionSlice(set, get),
      ...createViewSlice(set, get),
      ...history.state,

      // document slice
      doc: start,
      drawingPipe: pipeFromDoc(start),

      load(doc, version = null) {
        // History is gone, so numbering restarts from the loaded document's highest ids.
        counters = maxCounters(doc);
        set({
          doc,
          drawingPipe: pipeFromDoc(doc),
          ...history.reset(doc, version),
          ...keepSelection(get, doc),
        });
      },

      replaceDocument(doc, opts) {
        // Keep ids rising past both documents so undo never meets a reused id.
        const c = maxCounters(doc);
        counters = { S: Math.max(counters.S, c.S), B: Math.max(counters.B, c.B) };
        set({ drawingPipe: pipeFromDoc(doc) });
        commit(doc, opts?.history);
      },

      setConditions(patch, opts) {
        const doc = get().doc;
        const merged = compact({ ...doc.conditions, ...patch });
        const r = conditionsSchema.safeParse(merged);
        if (!r.success) return refuse(firstIssue(r, 'conditions'));
        commit({ ...doc, conditions: merged }, opts?.history);
        return ok;
      },

      setMeta(meta, opts) {
        const doc = get().doc;
        const next: { -readonly [K in keyof SpoolDocument]: SpoolDocument[K] } = { ...doc };
        for (const key of ['name', 'line'] as const) {
          const v = meta[key];
          if (v === undefined) continue;
          if (v.trim() === '') delete next[key];
          else next[key] = v;
        }
        if (next.name !== doc.name || next.line !== doc.line) commit(next, opts?.history);
      },

      setDefaultBendRadius(radius, opts) {
        const r = bendRadiusSchema.safeParse(radius);
        if (!r.success) return refuse(firstIssue(r, 'defaultBendRadius'));
        commit({ ...get().doc, defaultBendRadius: radius }, opts?.history);
        return ok;
      },

      setShopSettings(patch, opts) {
        const doc = get().doc;
        const merged = compact({ ...doc.shop, ...patch });
        const r = shopSettingsSchema.safeParse(merged);
        if (!r.success) return refuse(firstIssue(r, 'shop'));
        const next: { -readonly [K in keyof SpoolDocument]: SpoolDocument[K] } = { ...doc };
        if (Object.keys(merged).length === 0) delete next.shop;
        else next.shop = merged;
        if (
          next.shop?.testTemperature !== doc.shop?.testTemperature ||
          next.shop?.bendTangent !== doc.shop?.bendTangent
        )
          commit(next, opts?.history);
        return ok;
      },

      setDrawingPipe(pipe) {
        set({ drawingPipe: pipe });
      },

      startRun({ nps, schedule, origin }, opts) {
        if (!npsSchema.safeParse(nps).success) return refuse('nps: must not be empty');
        if (!scheduleSchema.safeParse(schedule).success)
          return refuse('schedule: must not be empty');
        if (origin && ![origin.x, origin.y, origin.z].every(Number.isFinite))
          return refuse('origin: must be finite numbers');
        set({ drawingPipe: { nps, schedule } });
        const doc = get().doc;
        const next: SpoolDocument = { ...doc, elements: [], ...(origin ? { origin } : {}) };
        commit(next, opts?.history);
        return ok;
      },

      addLeg(direction, length, opts) {
        const dir = legVector(direction);
        if (isRefusal(dir)) return dir;
        const bad = checkLength(length, 'a leg length');
        if (bad) return bad;
        return editRun((run, newIds) => {
          // A new leg; serializeRun merges it into the last leg when it runs the same way
          // and puts a bend in the corner otherwise.
          const piece = newStraight(dir, newIds);
          run.legs.push({ dir, pieces: [piece], work: [length] });
          if (run.legs.length > 1) run.corners.push(null);
        }, opts);
      },

      insertLegAfter(id, direction, length, opts) {
        const dir = legVector(direction);
        if (isRefusal(dir)) return dir;
        const bad = checkLength(length, 'a leg length');
        if (bad) return bad;
        return editRun((run, newIds) => {
          const at = locate(run, id);
          if (!at) return refuse(`no element "${id}"`);
          const newLeg: Leg = {
            dir,
            pieces: [newStraight(dir, newIds)],
            work: [length],
          };
          if (at.kind === 'corner') {
            // At the start of the leg after the bend.
            run.legs.splice(at.corner + 1, 0, newLeg);
            run.corners.splice(at.corner + 1, 0, null);
            return;
          }
          const leg = run.legs[at.leg]!;
          const left: Leg = {
            dir: leg.dir,
            pieces: leg.pieces.slice(0, at.piece + 1),
            work: leg.work.slice(0, at.piece + 1),
          };
          const right: Leg = {
            dir: leg.dir,
            pieces: leg.pieces.slice(at.piece + 1),
            work: leg.work.slice(at.piece + 1),
          };
          const replacement = right.pieces.length > 0 ? [left, newLeg, right] : [left, newLeg];
          run.legs.splice(at.leg, 1, ...replacement);
          run.corners.splice(at.leg, 0, ...replacement.slice(1).map(() => null));
        }, opts);
      },

      updateElement(id, patch, opts) {
        const doc = get().doc;
        const el = doc.elements.find((e) => e.id === id);
        if (!el) return refuse(`no element "${id}"`);
        const has = (k: keyof ElementPatch) => Object.prototype.hasOwnProperty.call(patch, k);

        // Validate values against the document schema's field rules.
        const checks: [keyof ElementPatch, { safeParse(v: unknown): { success: boolean } }][] = [
          ['nps', npsSchema],
          ['schedule', scheduleSchema],
          ['direction', directionSchema],
          ['heading', headingSchema],
          ['endType', endTypeSchema],
          ['bendRadius', bendRadiusSchema],
        ];
        for (const [key, schema] of checks) {
          if (has(key) && patch[key] !== undefined) {
            const r = schema.safeParse(patch[key]);
            if (!r.success) return refuse(firstIssue(r as Parameters<typeof firstIssue>[0], key));
          }
        }
        for (const key of [
          'length',
          'legLength',
          'angle',
          'outsideDiameter',
          'insideDiameter',
          'nominalWall',
        ] as const) {
          if (has(key) && patch[key] !== undefined) {
            const v = patch[key];
            if (!(typeof v === 'number' && Number.isFinite(v) && v > 0))
              return refuse(`${key}: must be greater than zero`);
          }
        }
        if (has('angle') && patch.angle !== undefined) {
          if (el.kind !== 'bend') return refuse('angle: a straight has no bend angle');
          if (!(patch.angle < 180))
            return refuse('angle: must be less than 180 degrees (180° would double back)');
        }
        if (el.kind === 'bend') {
          for (const key of ['length', 'legLength', 'endType'] as const)
            if (has(key))
              return refuse(
                `${key}: a bend has no ${key === 'endType' ? 'end type' : 'length of its own'}; edit the legs it joins`,
              );
          if (has('bendRadius') && patch.bendRadius === undefined)
            return refuse('bendRadius: a bend needs a radius');
        } else if (has('bendRadius')) return refuse('bendRadius: a straight has no bend radius');
        if (has('length') && patch.length === undefined)
          return refuse('length: a straight needs a length');

        // Non-structural fields.
        const fields: Record<string, unknown> = {};
        for (const key of [
          'nps',
          'schedule',
          'outsideDiameter',
          'insideDiameter',
          'nominalWall',
          'endType',
          'tag',
          'bendRadius',
        ] as const) {
          if (has(key)) fields[key] = patch[key];
        }
        let conditions: ConditionOverrides | undefined = el.conditions;
        if (has('conditions')) {
          const merged =
            patch.conditions === null || patch.conditions === undefined
              ? {}
              : compact({ ...el.conditions, ...patch.conditions });
          const r = conditionOverridesSchema.safeParse(merged);
          if (!r.success) return refuse(firstIssue(r, 'conditions'));
          conditions = Object.keys(merged).length > 0 ? merged : undefined;
          fields.conditions = conditions;
        }
        const updated = compact({ ...el, ...fields }) as SpoolElement;
        // The element as a whole must stay valid (e.g. an NPS or an outside diameter, a
        // schedule or a nominal wall), or the document could not be saved.
        const whole = spoolElementSchema.safeParse(updated);
        if (!whole.success) return refuse(firstIssue(whole, ''));
        const turnTo: Vec3 | undefined =
          has('heading') && patch.heading !== undefined
            ? headingToVec(patch.heading)
            : has('direction') && patch.direction !== undefined
              ? DIRECTION_VECTORS[patch.direction]
              : undefined;

        return editRun(
          (run) => {
            const at = locate(run, id);
            if (!at) return refuse(`no element "${id}"`);
            if (at.kind === 'corner') {
              run.corners[at.corner] = updated as (typeof run.corners)[number];
              const next = run.legs[at.corner + 1];
              if (turnTo && next) next.dir = turnTo;
              if (has('angle') && patch.angle !== undefined && next) {
                // Turn the next leg in the plane of the legs the bend joins.
                const u = run.legs[at.corner]!.dir;
                const cur = next.dir;
                const perp = sub(cur, scale(u, dot(cur, u)));
                if (norm(perp) < 1e-9)
                  return refuse(
                    `angle: ${id} joins legs that run the same way; turn a leg instead`,
                  );
                const t = normalize(perp);
                const theta = (patch.angle * Math.PI) / 180;
                next.dir = normalize(add(scale(u, Math.cos(theta)), scale(t, Math.sin(theta))));
              }
              return;
            }
            const leg = run.legs[at.leg]!;
            const j = at.piece;
            const piece = updated as (typeof leg.pieces)[number];
            const cut = leg.pieces[j]!.length;
            leg.pieces[j] = piece;
            if (has('length') && patch.length !== undefined)
              leg.work[j] = leg.work[j]! + (patch.length - cut);
            if (has('legLength') && patch.legLength !== undefined) {
              const total = leg.work.reduce((a, b) => a + b, 0);
              leg.work[j] = leg.work[j]! + (patch.legLength - total);
            }
            if (turnTo && angleBetweenDeg(turnTo, leg.dir) > 1e-6) {
              const dir = turnTo;
              if (leg.pieces.length === 1) leg.dir = dir;
              else {
                const parts: Leg[] = [
                  { dir: leg.dir, pieces: leg.pieces.slice(0, j), work: leg.work.slice(0, j) },
                  { dir, pieces: [piece], work: [leg.work[j]!] },
                  { dir: leg.dir, pieces: leg.pieces.slice(j + 1), work: leg.work.slice(j + 1) },
                ].filter((p) => p.pieces.length > 0);
                run.legs.splice(at.leg, 1, ...parts);
                run.corners.splice(at.leg, 0, ...parts.slice(1).map(() => null));
              }
            }
          },
          opts,
          `turning ${id} ${patch.heading ? 'that way' : (patch.direction ?? '')} would make the run double back on itself`.replace(
            /\s+/g,
            ' ',
          ),
        );
      },

      deleteElement(id, opts) {
        return editRun(
          (run) => {
            const at = locate(run, id);
            if (!at) return refuse(`no element "${id}"`);
            if (at.kind === 'piece') {
              const leg = run.legs[at.leg]!;
              leg.pieces.splice(at.piece, 1);
              leg.work.splice(at.piece, 1);
              if (leg.pieces.length === 0) leg.collapse = true;
              return;
            }
            const c = at.corner;
            const before = run.legs[c]!;
            const after = run.legs[c + 1]!;
            if (after.pieces.length === 0 && c + 1 === run.legs.length - 1) {
              run.legs.splice(c + 1, 1);
              run.corners.splice(c, 1);
              return;
            }
            if (before.pieces.length === 0 && c === 0) {
              run.legs.splice(0, 1);
              run.corners.splice(0, 1);
              return;
            }
            return refuse(
              `${id} joins two legs in different directions; delete or turn a leg instead`,
            );
          },
          opts,
          `deleting ${id} would make the run double back on itself`,
        );
      },
    };
  });
}

/** Describe a leg length for messages (document units). */
export { formatLength };
