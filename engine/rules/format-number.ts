/** Numbers for finding messages: a few significant digits, no trailing zeros, no exponent for everyday sizes. */
export function fmt(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return v > 0 ? '∞' : v < 0 ? '−∞' : 'n/a';
  if (v === 0) return '0';
  const abs = Math.abs(v);
  let s: string;
  if (abs >= 1e-4 && abs < 1e15) {
    const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
    s = v.toFixed(Math.min(decimals, 20));
    if (s.includes('.')) s = s.replace(/0+$/, '').replace(/\.$/, '');
  } else {
    s = v.toPrecision(digits);
  }
  return s === '-0' ? '0' : s;
}

/** A ratio as "4.1×" (three significant digits below 10, whole numbers above). */
export function times(v: number): string {
  if (!Number.isFinite(v)) return fmt(v);
  return `${Math.abs(v) >= 10 ? Math.round(v).toString() : fmt(v, 3)}×`;
}

/** A share of a whole as a percentage, "24.3%". */
export function percent(share: number, digits = 3): string {
  return `${fmt(share * 100, digits)}%`;
}
