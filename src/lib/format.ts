/** Number formatting for engineering values: fixed significant digits, no trailing noise. */
export function formatNumber(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 10 ** digits) return Math.round(value).toLocaleString('en-US');
  const s = Number(value.toPrecision(digits));
  return s.toLocaleString('en-US', { maximumFractionDigits: 6 });
}

/** Margin as a signed percentage, e.g. "+12.5 %". */
export function formatPercent(fraction: number | null | undefined): string {
  if (fraction === null || fraction === undefined || !Number.isFinite(fraction)) return '—';
  const p = fraction * 100;
  return `${p >= 0 ? '+' : ''}${p.toFixed(1)} %`;
}

const dateFmt = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export function formatDateTime(iso: string): string {
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? iso : dateFmt.format(d);
}
