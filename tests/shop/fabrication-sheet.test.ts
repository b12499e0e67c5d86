import { describe, expect, it } from 'vitest';
import { checkSpool } from '@shared/engine/index';
import { getPipeWall } from '@shared/data/pipe-dimensions';
import { parseSpoolDocument, type SpoolDocument } from '@shared/model/spool';
import {
  buildFabricationSheet,
  bendArcLength,
  bendTangentLength,
  bomTable,
  csvFileName,
  cutListTable,
  elementTable,
  pipeMassPerRun,
  tableToCsv,
  toShopJson,
} from '@shared/shop/index';
import { neutraliseCell } from '@shared/csv/neutralise';
import { buildSpoolPath, legLengths } from '@/features/sketch/geometry/spool-path';
import { createSpoolStore } from '@/features/sketch/store/spool-store';

const doc = (input: unknown): SpoolDocument => {
  const r = parseSpoolDocument(input);
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return r.doc;
};
const sheetOf = (d: SpoolDocument) => buildFabricationSheet(d, checkSpool(d));
const CS = 7850; // kg/m³, the density behind the B36.10M plain-end formulas (0.0246615 = 7850·π·10⁻⁶)

describe('pipe masses — ASME B36.10M plain-end weights', () => {
  // ASME B36.10M Table 1, plain-end mass (lb/ft), and OD / wall (in) of the same rows.
  it.each([
    ['2', '40', 3.65],
    ['4', '40', 10.79],
    ['6', '40', 18.97],
  ])('NPS %s Sch %s: %s lb/ft (B36.10M Table 1)', (nps, sch, lbPerFt) => {
    const w = getPipeWall(nps, sch)!;
    const m = pipeMassPerRun(w.odIn, w.wallIn, CS, 'imperial');
    // The tabulated rows imply 10.68 (0.2833 lb/in³) where the printed formula says 10.69 (0.2836 lb/in³):
    // the formula is followed, and agrees with the rows to 0.25 % (a 1 % density error would not).
    expect(Math.abs(m - lbPerFt) / lbPerFt).toBeLessThan(0.0025);
    // B36.10M formula, M = 10.69·(D − t)·t lb/ft, to its four significant figures.
    expect(m / ((w.odIn - w.wallIn) * w.wallIn)).toBeCloseTo(10.69, 2);
  });
  it('metric: 0.0246615·(D − t)·t kg/m (B36.10M metric formula); NPS 4 Sch 40 114.3 × 6.02 mm ≈ 16.07 kg/m (B36.10M metric column, from memory)', () => {
    const m = pipeMassPerRun(114.3, 6.02, CS, 'metric');
    expect(m).toBeCloseTo(0.0246615 * (114.3 - 6.02) * 6.02, 4);
    expect(m).toBeCloseTo(16.07, 1);
  });
  it('other materials scale by density (type 316 7.98 g/cm³, published product data)', () => {
    const base = { units: 'imperial', conditions: { pressure: 150, temperature: 100 } };
    const cs = sheetOf(
      doc({
        ...base,
        conditions: { ...base.conditions, material: 'A106-B' },
        elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '40S', length: 120 }],
      }),
    );
    const ss = sheetOf(
      doc({
        ...base,
        conditions: { ...base.conditions, material: 'A312-TP316' },
        elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '40S', length: 120 }],
      }),
    );
    expect(ss.elements[0]!.mass / cs.elements[0]!.mass).toBeCloseTo(7980 / 7850, 9);
    // 10 ft of NPS 4 Sch 40 carbon steel: 10 × 10.79 lb (B36.10M Table 1), to 0.25 %.
    expect(Math.abs(cs.totalMass - 107.9) / 107.9).toBeLessThan(0.0025);
  });
  it('water-filled mass adds the bore full of water (1000 kg/m³, common practice)', () => {
    const s = sheetOf(
      doc({
        units: 'metric',
        conditions: { pressure: 1, temperature: 20, material: 'A106-B' },
        elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 1000 }],
      }),
    );
    const bore = 114.3 - 2 * 6.02; // mm, B36.10M NPS 4 Sch 40
    expect(s.filledMass - s.totalMass).toBeCloseTo((1000 * Math.PI * (bore / 1000) ** 2) / 4, 6);
  });
});

// A spool drawn in the sketcher: east 100, north 50, up 30 in (intersection to intersection), NPS 2 Sch 40, 3D bends (R = 6 in).
const drawn = (): SpoolDocument => {
  const store = createSpoolStore({
    units: 'imperial',
    conditions: { pressure: 300, temperature: 200, material: 'A106-B' },
    defaultBendRadius: { multipleOfD: 3 },
    elements: [],
  });
  const s = store.getState();
  s.startRun({ nps: '2', schedule: '40' });
  s.addLeg('east', 100);
  s.addLeg('north', 50);
  s.addLeg('up', 30);
  return store.getState().doc;
};

describe('cut list of drawn spools (bend tangent R·tan(θ/2), arc R·θ)', () => {
  it('cut lengths are the legs less the tangents of the bends beside them, as the sketch labels', () => {
    const d = drawn();
    const sheet = sheetOf(d);
    const cuts = Object.fromEntries(sheet.elements.map((e) => [e.id, e.cutLength]));
    const straights = sheet.elements.filter((e) => e.kind === 'straight');
    expect(straights.map((e) => e.cutLength)).toEqual([94, 38, 24]); // 100 − 6, 50 − 2·6, 30 − 6
    const legs = legLengths(buildSpoolPath(d));
    for (const e of straights)
      expect(e.tangentBefore + e.cutLength + e.tangentAfter).toBeCloseTo(legs.get(e.id)!, 9);
    const bends = sheet.elements.filter((e) => e.bend);
    expect(bends).toHaveLength(2);
    for (const b of bends) {
      expect(b.bend!.tangent).toBeCloseTo(6, 9); // 6 × tan 45°
      expect(b.bend!.arcLength).toBeCloseTo(3 * Math.PI, 9); // 6 × π/2
      expect(cuts[b.id]).toBeCloseTo(3 * Math.PI, 9);
    }
    // Developed length: Σ straights + Σ arcs, as the sketch path measures it.
    expect(sheet.developedLength).toBeCloseTo(buildSpoolPath(d).developedLength, 9);
    expect(sheet.developedLength).toBeCloseTo(156 + 6 * Math.PI, 9);
    // Four butt welds between five pieces; free ends bevelled by default.
    expect(sheet.welds).toBe(4);
    expect(sheet.elements[0]!.ends[0]).toMatchObject({ at: 'free', prep: 'bevel' });
    expect(sheet.elements[0]!.ends[1]).toMatchObject({ at: 'joint', to: sheet.elements[1]!.id });
  });
  it('a 45° bend takes R·tan(22.5°) from each leg and has an arc of R·π/4; bending tangents lengthen the bend pipe only', () => {
    const d = doc({
      units: 'imperial',
      conditions: { pressure: 150, temperature: 100, material: 'A106-B' },
      shop: { bendTangent: 8 },
      elements: [
        { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 30, endType: 'threaded' },
        {
          id: 'B1',
          kind: 'bend',
          nps: '4',
          schedule: '40',
          bendRadius: { multipleOfD: 3 },
          angle: 45,
        },
        { id: 'S2', kind: 'straight', nps: '4', schedule: '40', length: 20 },
      ],
    });
    const s = sheetOf(d);
    const b = s.elements[1]!;
    expect(bendTangentLength(12, 45)).toBeCloseTo(4.970563, 6); // 12 × tan 22.5°
    expect(b.bend!.tangent).toBeCloseTo(12 * Math.tan(Math.PI / 8), 12);
    expect(b.bend!.arcLength).toBeCloseTo(bendArcLength(12, 45), 12);
    expect(b.bend!.arcLength).toBeCloseTo(3 * Math.PI, 12);
    expect(b.cutLength).toBeCloseTo(3 * Math.PI + 16, 12);
    expect(s.elements[0]!.tangentAfter).toBeCloseTo(b.bend!.tangent, 12);
    expect(s.elements[2]!.tangentBefore).toBeCloseTo(b.bend!.tangent, 12);
    expect(s.developedLength).toBeCloseTo(50 + 3 * Math.PI, 12);
    expect(s.orderLength).toBeCloseTo(50 + 3 * Math.PI + 16, 12);
    // S1 threaded: its joint to B1 is not a butt weld.
    expect(s.welds).toBe(1);
    expect(s.otherJoints).toBe(1);
    expect(s.elements[0]!.ends[0].text).toContain('threaded');
    expect(bendTangentLength(12, 180)).toBe(0);
  });
});

describe('bend list follows the engine', () => {
  // NPS 4 Sch 40, 3D bend, 1000 psi, A106 B at 100 °F, c = 1/16 in: passes, but the wall before bending needs a heavier schedule.
  const d = doc({
    units: 'imperial',
    conditions: {
      pressure: 1000,
      temperature: 100,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
    },
    elements: [
      { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 24 },
      {
        id: 'B1',
        kind: 'bend',
        nps: '4',
        schedule: '40',
        bendRadius: { multipleOfD: 3 },
        angle: 90,
      },
    ],
  });
  const check = checkSpool(d);
  const sheet = buildFabricationSheet(d, check);
  const pb = check.elements[1]!.preBend!;
  const b = sheet.elements[1]!;
  it('orders the schedule the check names, with its wall', () => {
    expect(pb.orderHeavier).toBe(true);
    expect(b.bend!.orderHeavier).toBe(true);
    expect(b.orderSchedule).toBe(pb.orderSchedule);
    expect(b.orderWall).toBe(getPipeWall('4', pb.orderSchedule!)!.wallIn);
    expect(b.orderWall).toBeGreaterThanOrEqual(pb.requiredOrderedWall);
    expect(sheet.elements[0]!.orderSchedule).toBe('40');
    expect(b.notes.join(' ')).toMatch(/order heavier/);
  });
  it('table factor and geometric estimate, the larger governs (B31.1 Table 102.4.5: 3D → 1.25)', () => {
    expect(b.bend!.tableFactor).toBeCloseTo(1.25, 9);
    expect(b.bend!.wallBeforeBending).toBeCloseTo(
      Math.max(pb.geometricWall, pb.tableWall ?? 0),
      12,
    );
    expect(b.bend!.radiusOverD).toBeCloseTo(12 / 4.5, 12);
    expect(b.bend!.radiusOverNps).toBeCloseTo(3, 12);
    expect(b.bend!.flattening).toContain('332.2.1');
  });
  it('walls after bending are those of the pipe as ordered (2R/D geometric estimate, common practice)', () => {
    const tmin = b.orderWall * 0.875;
    const k = (2 * 12) / 4.5;
    expect(b.bend!.extradosWallAfter).toBeCloseTo((tmin * k) / (k + 1), 9);
    expect(b.bend!.intradosWallAfter).toBeCloseTo((tmin * k) / (k - 1), 9);
    expect(b.bend!.extradosWallAfter).toBeGreaterThanOrEqual(b.bend!.extradosWallRequired!);
  });
  it('bill of materials groups by NPS, schedule as ordered and material', () => {
    expect(sheet.bom.map((l) => [l.nps, l.schedule, l.material, l.pieces])).toEqual([
      ['4', '40', 'A106-B', 1],
      ['4', pb.orderSchedule, 'A106-B', 1],
    ]);
    expect(sheet.bom.reduce((s, l) => s + l.mass, 0)).toBeCloseTo(
      sheet.elements.reduce((s, e) => s + e.mass, 0),
      9,
    );
  });
  it('JSON has the documented shape', () => {
    const j = toShopJson(sheet);
    expect(Object.keys(j)).toEqual([
      'units',
      'elements',
      'bom',
      'welds',
      'developedLength',
      'totalMass',
      'filledMass',
      'hydrotest',
      'caution',
    ]);
    expect(Object.keys(j.elements[1]!)).toEqual([
      'id',
      'kind',
      'nps',
      'schedule',
      'orderSchedule',
      'orderWall',
      'cutLength',
      'mass',
      'bend',
    ]);
    expect(Object.keys(j.elements[1]!.bend!)).toEqual([
      'angle',
      'radius',
      'radiusOverD',
      'tableFactor',
      'wallBeforeBending',
      'extradosWallAfter',
      'intradosWallAfter',
      'arcLength',
      'tangent',
    ]);
    expect(Object.keys(j.bom[0]!)).toEqual(['nps', 'schedule', 'material', 'length', 'mass']);
    expect(Object.keys(j.hydrotest!)).toEqual([
      'pressure',
      'ratio',
      'limitedBy',
      'governing',
      'equation',
    ]);
  });
  it('leaves out uncheckable elements and says so', () => {
    const bad = doc({
      units: 'imperial',
      conditions: { pressure: 100, temperature: 100, material: 'A106-B' },
      elements: [
        { id: 'S1', kind: 'straight', nps: '4', schedule: '40', length: 10 },
        { id: 'S2', kind: 'straight', nps: '4', schedule: '999', length: 10 },
      ],
    });
    const s = sheetOf(bad);
    expect(s.elements.map((e) => e.id)).toEqual(['S1']);
    expect(s.skipped[0]).toMatchObject({ id: 'S2' });
    expect(s.notes.join(' ')).toContain('S2');
  });
});

describe('hydrotest — B31.3 para. 345.4.2', () => {
  const spool = (conditions: Record<string, unknown>, elements: unknown[], shop?: unknown) =>
    doc({ units: 'imperial', conditions, elements, ...(shop ? { shop } : {}) });
  it('worked example: A106 B at 500 °F, ST/S = 20.0/18.9 → PT = 1.587·P (B31.3 Table A-1 values, para. 345.4.2)', () => {
    const s = sheetOf(
      spool({ pressure: 100, temperature: 500, material: 'A106-B' }, [
        { id: 'S1', kind: 'straight', nps: '4', schedule: '80', length: 24 },
      ]),
    );
    const h = s.hydrotest!;
    expect(h.ratio).toBeCloseTo(20.0 / 18.9, 9);
    expect(h.pressure / 100).toBeCloseTo(1.587, 3);
    expect(h.governing).toBe('S1');
    expect(h.limitedBy).toBeNull();
    expect(h.testTemperature).toBe(70); // default 70 °F
    expect(h.equation).toContain('345.4.2');
    expect(h.caution).toMatch(/owner/);
  });
  it('the lowest ratio governs across materials (A312 TP316 at 500 °F 18.0 ksi, from memory)', () => {
    const s = sheetOf(
      spool({ pressure: 100, temperature: 500, material: 'A106-B' }, [
        {
          id: 'S1',
          kind: 'straight',
          nps: '4',
          schedule: '80',
          length: 24,
          conditions: { material: 'A312-TP316' },
        },
        { id: 'S2', kind: 'straight', nps: '4', schedule: '80', length: 24 },
      ]),
    );
    expect(s.hydrotest!.governing).toBe('S2');
    expect(s.hydrotest!.ratio).toBeCloseTo(20.0 / 18.9, 9);
  });
  it('ST/S is capped at 6.5 (para. 345.4.2(b)); A106 B at 1000 °F: S = 2.5 ksi, from memory', () => {
    const s = sheetOf(
      spool({ pressure: 10, temperature: 1000, material: 'A106-B' }, [
        { id: 'S1', kind: 'straight', nps: '4', schedule: '80', length: 24 },
      ]),
    );
    expect(s.hydrotest!.ratio).toBe(6.5);
    expect(s.hydrotest!.pressure).toBeCloseTo(1.5 * 10 * 6.5, 9);
    expect(s.hydrotest!.notes.join(' ')).toContain('6.5');
  });
  it('reduced to the yield-limited pressure when PT would exceed yield at test temperature (para. 345.4.2(c))', () => {
    // A106 B at 900 °F: S = 6.5 ksi (from memory) → ST/S = 20.0/6.5; P = 1000 psi → PT = 4615 psi.
    // NPS 2 Sch 40 (2.375 × 0.154 in, B36.10M) less 12.5 %: t = 0.13475 in; Sy = 35 ksi at 70 °F (specified minimum, ASTM A106);
    // Y = 0.4 (Table 304.1.1, ferritic ≤ 900 °F): P = 2·Sy·t / (D − 2·Y·t) = 4160 psi.
    const s = sheetOf(
      spool({ pressure: 1000, temperature: 900, material: 'A106-B' }, [
        { id: 'S1', kind: 'straight', nps: '2', schedule: '80', length: 24 },
        { id: 'S2', kind: 'straight', nps: '2', schedule: '40', length: 24 },
      ]),
    );
    const h = s.hydrotest!;
    expect(h.unreducedPressure).toBeCloseTo(1.5 * 1000 * (20.0 / 6.5), 6);
    const t = 0.154 * 0.875;
    expect(h.pressure).toBeCloseTo((2 * 35000 * t) / (2.375 - 2 * 0.4 * t), 6);
    expect(h.pressure).toBeCloseTo(4160.4, 0);
    expect(h.limitedBy).toBe('S2');
    expect(h.equation).toContain('345.4.2(c)');
  });
  it('test temperature is a spool setting (°C in metric documents, default 21 °C)', () => {
    const m = sheetOf(
      doc({
        units: 'metric',
        conditions: { pressure: 1, temperature: 260, material: 'A106-B' },
        elements: [{ id: 'S1', kind: 'straight', nps: '4', schedule: '80', length: 600 }],
      }),
    );
    expect(m.hydrotest!.testTemperature).toBe(21);
    expect(m.hydrotest!.ratio).toBeCloseTo(20.0 / 18.9, 9); // 260 °C = 500 °F
    const hot = sheetOf(
      spool(
        { pressure: 100, temperature: 500, material: 'A106-B' },
        [{ id: 'S1', kind: 'straight', nps: '4', schedule: '80', length: 24 }],
        { testTemperature: 500 },
      ),
    );
    expect(hot.hydrotest!.ratio).toBeCloseTo(1, 12);
  });
});

describe('exports', () => {
  const d = drawn();
  const check = checkSpool(d);
  const sheet = buildFabricationSheet(d, check);
  it('headers carry units; file names carry spool and revision', () => {
    expect(cutListTable(sheet).fields).toContain('cut length (in)');
    expect(bomTable(sheet).fields).toContain('mass (lb)');
    expect(elementTable(d, check).fields).toContain('MAWP (psi)');
    expect(csvFileName('CW 101/A', 3, 'cut-list')).toBe('CW-101-A-rev3-cut-list.csv');
  });
  it('cells a spreadsheet would run as formulas are neutralised; numbers stay numbers', () => {
    expect(neutraliseCell('=HYPERLINK("x")')).toBe('\'=HYPERLINK("x")');
    expect(neutraliseCell('+1')).toBe("'+1");
    expect(neutraliseCell('-2')).toBe("'-2");
    expect(neutraliseCell('@SUM(A1)')).toBe("'@SUM(A1)");
    expect(neutraliseCell(-2.5)).toBe(-2.5);
    expect(neutraliseCell('S1')).toBe('S1');
    const csv = tableToCsv({ fields: ['element', 'margin (%)'], rows: [['=cmd|calc', -4.5]] });
    expect(csv).toBe("element,margin (%)\n'=cmd|calc,-4.5\n");
  });
});
