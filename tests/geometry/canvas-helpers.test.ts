import { describe, expect, it } from 'vitest';
import type { SpoolDocument, SpoolElement } from '@shared/model/spool';
import { buildSpoolPath } from '@/features/sketch/geometry/spool-path';
import { computeMarkers } from '@/features/sketch/canvas/end-markers';
import {
  AUTO_LABEL_LIMIT,
  dimensionText,
  pickLabelled,
} from '@/features/sketch/canvas/dimension-labels';
import {
  elementAtTriangle,
  mergeElementGeometries,
  worldGeometry,
} from '@/features/sketch/canvas/element-chunks';
import { meshSpecOf, niceStep } from '@/features/sketch/canvas/scene-math';
import { STATUS_ORDER, STATUS_STYLES } from '@/features/sketch/canvas/status-style';

const conditions = { pressure: 300, temperature: 200, material: 'A106-B' };
const pipe = { nps: '2', schedule: '40' } as const;
const doc = (elements: SpoolElement[]): SpoolDocument => ({
  units: 'imperial',
  conditions,
  elements,
});

describe('end marks', () => {
  it('marks welds between straights, tangent points at bends and open run ends', () => {
    const path = buildSpoolPath(
      doc([
        { kind: 'straight', id: 'S1', ...pipe, length: 50, direction: 'east' },
        { kind: 'straight', id: 'S2', ...pipe, length: 50, direction: 'east', endType: 'bevel' },
        {
          kind: 'bend',
          id: 'B1',
          ...pipe,
          bendRadius: { multipleOfD: 3 },
          angle: 90,
          direction: 'up',
        },
        { kind: 'straight', id: 'S3', ...pipe, length: 20, endType: 'threaded' },
      ]),
    );
    const kinds = computeMarkers(path.segments)
      .map((m) => m.kind)
      .sort();
    // open start of S1, weld S1|S2, tangent S2|B1, tangent B1|S3, three thread rings at S3's free end.
    expect(kinds).toEqual(['open', 'tangent', 'tangent', 'thread', 'thread', 'thread', 'weld']);
  });
});

describe('labels', () => {
  const many = (n: number) =>
    buildSpoolPath(
      doc(
        Array.from({ length: n }, (_, i) => ({
          kind: 'straight' as const,
          id: `S${i + 1}`,
          ...pipe,
          length: 10,
          direction: 'east' as const,
        })),
      ),
    ).segments;

  it('auto labels small spools, only the focused elements of large ones', () => {
    expect(pickLabelled(many(5), 'auto', null, null)).toHaveLength(5);
    expect(pickLabelled(many(AUTO_LABEL_LIMIT + 1), 'auto', 'S3', 'S7').map((s) => s.id)).toEqual([
      'S3',
      'S7',
    ]);
    expect(pickLabelled(many(5), 'none', 'S2', null).map((s) => s.id)).toEqual(['S2']);
    expect(pickLabelled(many(30), 'all', null, null)).toHaveLength(30);
  });

  it('says a straight cut length and a bend angle with radius', () => {
    const path = buildSpoolPath(
      doc([
        { kind: 'straight', id: 'S1', ...pipe, length: 94, direction: 'east' },
        {
          kind: 'bend',
          id: 'B1',
          ...pipe,
          bendRadius: { multipleOfD: 3 },
          angle: 90,
          direction: 'north',
        },
      ]),
    );
    expect(path.segments.map((s) => dimensionText(s, 'imperial'))).toEqual(['94 in', '90° R6 in']);
  });
});

describe('merged chunks', () => {
  it('maps each triangle back to its element', () => {
    const path = buildSpoolPath(
      doc([
        { kind: 'straight', id: 'S1', ...pipe, length: 94, direction: 'east' },
        {
          kind: 'bend',
          id: 'B1',
          ...pipe,
          bendRadius: { multipleOfD: 3 },
          angle: 90,
          direction: 'north',
        },
        { kind: 'straight', id: 'S2', ...pipe, length: 30 },
      ]),
    );
    const parts = path.segments.map((s) => ({ id: s.id, geometry: worldGeometry(meshSpecOf(s)) }));
    const tris = parts.map((p) => p.geometry.getIndex()!.count / 3);
    const { geometry, ranges } = mergeElementGeometries(parts);
    expect(geometry.getIndex()!.count / 3).toBe(tris[0]! + tris[1]! + tris[2]!);
    expect(elementAtTriangle(ranges, 0)).toBe('S1');
    expect(elementAtTriangle(ranges, tris[0]!)).toBe('B1');
    expect(elementAtTriangle(ranges, tris[0]! + tris[1]!)).toBe('S2');
    expect(elementAtTriangle(ranges, tris[0]! + tris[1]! + tris[2]!)).toBeUndefined();
    // The placed straight spans its centreline: x from 0 to 94.
    geometry.computeBoundingBox();
    expect(geometry.boundingBox!.min.x).toBeCloseTo(-0, 6);
    expect(geometry.boundingBox!.max.x).toBeCloseTo(100 + 2.375 / 2, 6);
  });
});

describe('palette', () => {
  it('gives every status its own colour, pattern and glyph', () => {
    const styles = STATUS_ORDER.map((s) => STATUS_STYLES[s]);
    for (const key of ['color', 'pattern', 'glyph'] as const)
      expect(new Set(styles.map((s) => s[key])).size).toBe(5);
  });

  // Colour-vision simulation: Viénot, Brettel & Mollon (1999) dichromat matrices in linear RGB
  // (coefficients from memory); distance CIE76 ΔE in CIELAB (D65).
  const SIM: Record<string, number[][]> = {
    normal: [
      [1, 0, 0],
      [0, 1, 0],
      [0, 0, 1],
    ],
    protanopia: [
      [0.11238, 0.88762, 0],
      [0.11238, 0.88762, 0],
      [0.00401, -0.00401, 1],
    ],
    deuteranopia: [
      [0.29275, 0.70725, 0],
      [0.29275, 0.70725, 0],
      [-0.02234, 0.02234, 1],
    ],
  };
  const linear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
  const toLab = (hex: string, m: number[][]) => {
    const c = [1, 3, 5].map((i) => linear(parseInt(hex.slice(i, i + 2), 16) / 255));
    const [r, g, b] = m.map((row) => row[0]! * c[0]! + row[1]! * c[1]! + row[2]! * c[2]!) as [
      number,
      number,
      number,
    ];
    const f = (t: number) => (t > 0.008856 ? Math.cbrt(t) : 7.787 * t + 16 / 116);
    const X = f((0.4124 * r + 0.3576 * g + 0.1805 * b) / 0.95047);
    const Y = f(0.2126 * r + 0.7152 * g + 0.0722 * b);
    const Z = f((0.0193 * r + 0.1192 * g + 0.9505 * b) / 1.08883);
    return [116 * Y - 16, 500 * (X - Y), 200 * (Y - Z)];
  };
  it.each(Object.keys(SIM))('keeps every pair of status colours ≥ 25 ΔE apart (%s)', (vision) => {
    const labs = STATUS_ORDER.map((s) => toLab(STATUS_STYLES[s].color, SIM[vision]!));
    for (let i = 0; i < labs.length; i++)
      for (let j = i + 1; j < labs.length; j++) {
        const [a, b] = [labs[i]!, labs[j]!];
        expect(
          Math.hypot(a[0]! - b[0]!, a[1]! - b[1]!, a[2]! - b[2]!),
          `${STATUS_ORDER[i]} / ${STATUS_ORDER[j]}`,
        ).toBeGreaterThanOrEqual(25);
      }
  });

  it('rounds grid steps to 1, 2, 5 × 10ⁿ', () => {
    expect([0.9, 1.6, 4, 8, 120].map(niceStep)).toEqual([1, 2, 5, 10, 100]);
  });
});
