import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';

/** The centred card of the pages outside sign-in (sign-in, forgot/reset password, accept invitation). */
export function AuthCard({
  intro,
  children,
}: {
  readonly intro: ReactNode;
  readonly children: ReactNode;
}) {
  return (
    <main className="flex min-h-screen items-center justify-center bg-steel-100 font-sans">
      <div className="w-full max-w-sm rounded-lg border border-steel-200 bg-white p-6 shadow-sm">
        <Link to="/sign-in" className="mb-5 flex items-center gap-2">
          <span aria-hidden className="inline-block h-4 w-4 rotate-45 border-2 border-copper-500" />
          <span className="text-xl font-semibold text-steel-800">Spoolwright</span>
        </Link>
        <div className="mb-4 text-sm text-steel-600">{intro}</div>
        {children}
      </div>
    </main>
  );
}
