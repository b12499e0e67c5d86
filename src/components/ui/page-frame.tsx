import type { ReactNode } from 'react';

/** Scrolling page body with a heading line, for the register-style pages. */
export function PageFrame({
  title,
  intro,
  actions,
  children,
}: {
  readonly title: string;
  readonly intro?: ReactNode;
  readonly actions?: ReactNode;
  readonly children: ReactNode;
}) {
  return (
    <div className="h-full overflow-auto bg-steel-50">
      <div className="mx-auto flex max-w-6xl flex-col gap-5 p-6">
        <div className="flex items-end gap-4">
          <div>
            <h1 className="text-lg font-semibold text-steel-800">{title}</h1>
            {intro ? <p className="mt-0.5 text-sm text-steel-600">{intro}</p> : null}
          </div>
          {actions ? <div className="ml-auto flex gap-2">{actions}</div> : null}
        </div>
        {children}
      </div>
    </div>
  );
}

/** A white panel with a small heading. */
export function Panel({
  title,
  children,
  label,
}: {
  readonly title: string;
  readonly children: ReactNode;
  readonly label?: string;
}) {
  return (
    <section
      aria-label={label ?? title}
      className="rounded-lg border border-steel-200 bg-white p-4 shadow-sm"
    >
      <h2 className="mb-3 text-sm font-semibold uppercase tracking-wide text-steel-600">{title}</h2>
      {children}
    </section>
  );
}

export const tableClass = 'w-full border-collapse text-sm';
export const thClass =
  'border-b border-steel-200 px-2 py-1.5 text-left text-xs font-semibold uppercase tracking-wide text-steel-500';
export const tdClass = 'border-b border-steel-100 px-2 py-1.5 align-top text-steel-800';
