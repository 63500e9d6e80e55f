const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** A number in engineering notation as the trade writes it: 2.31 × 10⁷; plain when 0.01 ≤ |x| < 10⁵. */
export function sci(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const magnitude = Math.abs(value);
  if (magnitude === 0) return '0';
  if (magnitude >= 0.01 && magnitude < 1e5) return Number(value.toPrecision(digits)).toString();
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  const power = String(Number(exponent))
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('');
  return `${mantissa} × 10${power}`;
}

/** A number with a fixed count of decimals, or a dash when there is none. */
export function fixed(value: number | null | undefined, decimals: number): string {
  return value === null || value === undefined || !Number.isFinite(value) ? '—' : value.toFixed(decimals);
}

/**
 * A bound as a hint shows it: large and small numbers as a power of ten with the shortest mantissa
 * (1 × 10⁴, 2.5 × 10⁶), others plain (0.95, 70).
 */
export function bound(value: number): string {
  const magnitude = Math.abs(value);
  if (magnitude === 0 || (magnitude >= 0.01 && magnitude < 1e4)) return String(value);
  const [mantissa, exponent] = value.toExponential().split('e');
  const power = String(Number(exponent))
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('');
  return `${mantissa} × 10${power}`;
}

/** A range as a hint says it: "1 × 10⁴ to 1 × 10¹⁰". */
export function rangeText(min: number, max: number): string {
  return `${bound(min)} to ${bound(max)}`;
}
