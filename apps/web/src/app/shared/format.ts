import { powerOfTen } from '@laminote/contracts/values';

/** A number in engineering notation as the trade writes it: 2.31 × 10⁷; plain when 0.01 ≤ |x| < 10⁵. */
export { sci } from '@laminote/contracts/values';

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
  return `${mantissa} × ${powerOfTen(Number(exponent))}`;
}

/** A range as a hint says it: "1 × 10⁴ to 1 × 10¹⁰". */
export function rangeText(min: number, max: number): string {
  return `${bound(min)} to ${bound(max)}`;
}

/**
 * Orders two ISO-8601 UTC timestamps (as the API writes them) by time: their text order is their time
 * order, so no locale is needed (`localeCompare` would start the browser's locale data, tens of ms on a
 * first call).
 */
export function byTime(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
