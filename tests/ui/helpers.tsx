import type { ReactNode } from 'react';
import { render } from '@testing-library/react';
import type { SpoolDocument, UnitSystem } from '@shared/model/spool';
import { DisplayUnitsProvider } from '@/features/sketch/components/display-units';
import { createSpoolStore, type SpoolStore } from '@/features/sketch/store/spool-store';
import { SpoolStoreProvider } from '@/features/sketch/store/spool-store-context';

/** A 2" Sch 40 A106 B spool drawn east, north, up, east (36 in legs, bends 1.5D). */
export function drawnStore(pressure = 150): SpoolStore {
  const doc: SpoolDocument = {
    units: 'imperial',
    name: 'UI test spool',
    conditions: {
      pressure,
      temperature: 100,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    defaultBendRadius: { multipleOfD: 1.5 },
    elements: [],
  };
  const store = createSpoolStore(doc);
  const s = store.getState();
  s.startRun({ nps: '2', schedule: '40' }, { history: 'never' });
  for (const d of ['east', 'north', 'up', 'east'] as const) {
    const r = store.getState().addLeg(d, 36, { history: 'never' });
    if (!r.ok) throw new Error(r.message);
  }
  return store;
}

export function renderWithStore(
  ui: ReactNode,
  store: SpoolStore,
  display: UnitSystem = 'imperial',
) {
  return render(
    <SpoolStoreProvider store={store}>
      <DisplayUnitsProvider doc={store.getState().doc.units} display={display}>
        {ui}
      </DisplayUnitsProvider>
    </SpoolStoreProvider>,
  );
}
