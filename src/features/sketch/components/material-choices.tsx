import { createContext, useContext, type ReactNode } from 'react';
import { MATERIALS } from '@shared/data/materials';

export interface MaterialChoice {
  readonly id: string;
  readonly label: string;
  /** Team materials are listed first and marked. */
  readonly team: boolean;
}

const libraryChoices: readonly MaterialChoice[] = MATERIALS.map((m) => ({
  id: m.id,
  label: `${m.spec} ${m.grade} — ${m.name}`,
  team: false,
}));

const MaterialChoicesContext = createContext<readonly MaterialChoice[]>(libraryChoices);

/** The material picker's rows (default: the built-in library). */
export function MaterialChoicesProvider({
  choices,
  children,
}: {
  choices: readonly MaterialChoice[] | undefined;
  children: ReactNode;
}) {
  return (
    <MaterialChoicesContext.Provider value={choices ?? libraryChoices}>
      {children}
    </MaterialChoicesContext.Provider>
  );
}

export function useMaterialChoices(): readonly MaterialChoice[] {
  return useContext(MaterialChoicesContext);
}

/** Picker rows from `GET /api/materials` items, team materials first. */
export function toMaterialChoices(
  items: readonly {
    id: string;
    spec: string;
    grade: string;
    name: string;
    origin: 'library' | 'team';
  }[],
): MaterialChoice[] {
  const rows = items.map((m) => ({
    id: m.id,
    label: `${m.spec} ${m.grade} — ${m.name}${m.origin === 'team' ? ' (team)' : ''}`,
    team: m.origin === 'team',
  }));
  return [...rows.filter((r) => r.team), ...rows.filter((r) => !r.team)];
}
