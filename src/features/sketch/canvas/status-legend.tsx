import type { CheckStatus, CheckSummary } from '@shared/engine/types';
import { STATUS_ORDER, STATUS_STYLES, statusSwatchBackground } from './status-style';

export interface StatusLegendProps {
  /** Counts per status; omitted counts are not shown. */
  readonly summary?: CheckSummary;
  readonly className?: string;
  /** Show only statuses that occur (when `summary` is given). */
  readonly onlyPresent?: boolean;
}

/** The key to the sketch's status colours, patterns and glyphs. */
export function StatusLegend({ summary, className, onlyPresent = false }: StatusLegendProps) {
  const shown = STATUS_ORDER.filter((s: CheckStatus) => !onlyPresent || !summary || summary[s] > 0);
  return (
    <ul
      aria-label="Check status key"
      data-testid="status-legend"
      className={`flex flex-wrap gap-x-3 gap-y-1 text-xs text-steel-700 ${className ?? ''}`}
    >
      {shown.map((status) => {
        const st = STATUS_STYLES[status];
        return (
          <li
            key={status}
            className="inline-flex items-center gap-1"
            title={st.description}
            data-status={status}
          >
            <span
              aria-hidden
              className="inline-block h-3 w-5 rounded-sm border border-steel-400"
              style={{ background: statusSwatchBackground(status) }}
            />
            <span aria-hidden className="font-semibold" style={{ color: st.ink }}>
              {st.glyph}
            </span>
            <span>{st.label}</span>
            {summary ? (
              <span className="tabular-nums text-steel-500">{summary[status]}</span>
            ) : null}
          </li>
        );
      })}
    </ul>
  );
}
