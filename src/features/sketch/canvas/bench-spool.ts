import type { Direction, SpoolDocument } from '@shared/model/spool';
import { createSpoolStore } from '../store/spool-store';

/** Schedules cycled per leg so the bench spool shows several statuses (NPS 2 at 1,500 psi). */
const SCHEDULES = ['40', '80', '10', '40', '5', '160', '40', 'XS'];

/**
 * A generated spool of about `count` elements for benchmarks: a serpentine of 2" legs that
 * fills rows east/west, steps north between rows and climbs a level after every few rows.
 */
export function generateBenchSpool(count: number): SpoolDocument {
  const store = createSpoolStore({
    units: 'imperial',
    name: `Bench spool (${count} elements)`,
    conditions: { pressure: 1500, temperature: 100, material: 'A106-B' },
    defaultBendRadius: { multipleOfD: 3 },
    elements: [],
  });
  const s = store.getState();
  s.startRun({ nps: '2', schedule: '40' }, { history: 'never' });
  const rowsPerLevel = 8;
  let row = 0;
  let level = 0;
  let leg = 0;
  let along: Direction = 'east';
  let step: Direction = 'north';
  while (store.getState().doc.elements.length < count) {
    s.setDrawingPipe({ nps: '2', schedule: SCHEDULES[leg % SCHEDULES.length]! });
    leg++;
    s.addLeg(along, 120, { history: 'never' });
    if (store.getState().doc.elements.length >= count) break;
    row++;
    if (row % rowsPerLevel === 0) {
      level++;
      s.addLeg('up', 40, { history: 'never' });
      step = step === 'north' ? 'south' : 'north';
    } else s.addLeg(step, 30, { history: 'never' });
    along = along === 'east' ? 'west' : 'east';
  }
  void level;
  const doc = store.getState().doc;
  return { ...doc, elements: doc.elements.slice(0, count) };
}
