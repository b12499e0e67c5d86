import { describe, expect, it } from 'vitest';
import type { SpoolDocument } from '@shared/model/spool';
import { runCheck, summarizeCheck, summarizeDocument } from '../../server/spools/check';
import { DEMO_SPOOLS } from '../../server/db/demo-spools';

// Stored summaries use the engine's numbers-first path; they must equal the summary of the full check.
const docs: SpoolDocument[] = [
  ...DEMO_SPOOLS,
  {
    units: 'metric',
    conditions: { pressure: 2, temperature: 150, material: 'A106-B', externalPressure: 0.1 },
    elements: [
      { id: 'A', kind: 'straight', nps: '6', schedule: '40', length: 1000 },
      {
        id: 'B',
        kind: 'bend',
        nps: '6',
        schedule: '10',
        bendRadius: { multipleOfD: 3 },
        angle: 90,
      },
      {
        id: 'C',
        kind: 'straight',
        nps: '6',
        schedule: 'XXS',
        length: 500,
        conditions: { pressure: 60 },
      },
      {
        id: 'D',
        kind: 'straight',
        nps: '6',
        schedule: '40',
        length: 500,
        conditions: { temperature: 900 },
      },
    ],
  },
];

describe('stored check summary on the fast path', () => {
  it.each(docs.map((d, i) => [i, d] as const))(
    'document %i: summarizeDocument = summarizeCheck(runCheck)',
    (_i, doc) => {
      expect(summarizeDocument(doc)).toEqual(summarizeCheck(runCheck(doc)));
    },
  );
  it('picks the worst element by severity, then the smallest margin', () => {
    const s = summarizeDocument(docs[docs.length - 1]!);
    expect(s.worst?.elementId).toBe('D');
    expect(s.worst?.status).toBe('invalid');
  });
});
