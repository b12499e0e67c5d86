import { cn } from '@/lib/cn';

/** Check-status look: each status has a tint and a glyph so it reads without colour too. */
const checkLook: Record<string, { cls: string; glyph: string; label: string }> = {
  pass: { cls: 'bg-emerald-50 text-emerald-800 border-emerald-300', glyph: '✓', label: 'pass' },
  marginal: { cls: 'bg-amber-50 text-amber-800 border-amber-300', glyph: '≈', label: 'marginal' },
  fail: { cls: 'bg-red-50 text-red-800 border-red-300', glyph: '✕', label: 'fail' },
  review: { cls: 'bg-violet-50 text-violet-800 border-violet-300', glyph: '?', label: 'review' },
  invalid: { cls: 'bg-steel-100 text-steel-700 border-steel-300', glyph: '!', label: 'invalid' },
};

export function CheckBadge({ status, className }: { readonly status: string | null | undefined; readonly className?: string }) {
  if (!status) return <span className="text-xs text-steel-400">—</span>;
  const look = checkLook[status] ?? checkLook.invalid!;
  return (
    <span
      data-check-status={status}
      className={cn('inline-flex items-center gap-1 rounded border px-1.5 py-px text-xs font-medium', look.cls, className)}
    >
      <span aria-hidden>{look.glyph}</span>
      {look.label}
    </span>
  );
}

const lifecycleLook: Record<string, { cls: string; label: string }> = {
  draft: { cls: 'bg-steel-100 text-steel-700', label: 'Draft' },
  submitted: { cls: 'bg-sky-100 text-sky-800', label: 'Awaiting check' },
  checked: { cls: 'bg-emerald-100 text-emerald-800', label: 'Checked' },
  released: { cls: 'bg-copper-500 text-white', label: 'Released' },
};

export function LifecycleBadge({ status }: { readonly status: string }) {
  const look = lifecycleLook[status] ?? { cls: 'bg-steel-100 text-steel-700', label: status };
  return (
    <span data-lifecycle={status} className={cn('inline-flex rounded px-1.5 py-px text-xs font-medium', look.cls)}>
      {look.label}
    </span>
  );
}
