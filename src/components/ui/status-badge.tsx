import type { CheckStatus } from '@shared/engine/types';
import { STATUS_STYLES, statusSwatchBackground } from '@/features/sketch/canvas/status-style';
import { cn } from '@/lib/cn';

/**
 * Check-status badge: the same colours, patterns and glyphs as the sketch (one visual code for
 * the whole app), so a status reads without colour too.
 */
export function CheckBadge({
  status,
  className,
}: {
  readonly status: string | null | undefined;
  readonly className?: string;
}) {
  if (!status) return <span className="text-xs text-steel-400">—</span>;
  const key = (status in STATUS_STYLES ? status : 'invalid') as CheckStatus;
  const look = STATUS_STYLES[key];
  return (
    <span
      data-check-status={status}
      title={look.description}
      className={cn(
        'inline-flex items-center gap-1 rounded border border-steel-200 bg-white px-1.5 py-px text-xs font-medium',
        className,
      )}
      style={{ color: look.ink }}
    >
      <span
        aria-hidden
        className="inline-block h-2.5 w-3.5 rounded-sm"
        style={{ background: statusSwatchBackground(key) }}
      />
      <span aria-hidden>{look.glyph}</span>
      {status}
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
    <span
      data-lifecycle={status}
      className={cn('inline-flex rounded px-1.5 py-px text-xs font-medium', look.cls)}
    >
      {look.label}
    </span>
  );
}
