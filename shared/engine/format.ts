/** Compact number formatting for the equation trail: 4 significant figures, no exponent for common magnitudes. */
export function fmt(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4) return value.toExponential(3).replace(/\.?0+e/, 'e');
  // Whole numbers (pressures, stresses, factors of 1) are the common case: no rounding needed.
  if (Number.isInteger(value)) return String(value);
  const digits = Math.max(0, 3 - Math.floor(Math.log10(abs)));
  return String(Number(value.toFixed(Math.min(digits, 6))));
}
