import { CAUTION } from '@shared/model/caution';

/** Placeholder shell; the sketcher and spool pages mount here. */
export function App() {
  return (
    <main className="mx-auto max-w-3xl p-8 font-sans">
      <h1 className="text-3xl font-semibold text-steel-800">Spoolwright</h1>
      <p className="mt-4 text-sm text-steel-600">{CAUTION}</p>
    </main>
  );
}
