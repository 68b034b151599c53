/** How the study pages write fractions and plain numbers. */
export function pct(v: number | null | undefined): string {
  return v === null || v === undefined ? '—' : `${(v * 100).toFixed(1)} %`;
}

export function fmt(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined) return '—';
  // Component values (pF, µH) would round to 0 as grouped decimals: show them as 2.16e-10.
  const a = Math.abs(v);
  if (a !== 0 && (a < 1e-3 || a >= 1e12)) return v.toPrecision(digits);
  return Number(v.toPrecision(digits)).toLocaleString('en', { maximumFractionDigits: 6 });
}
