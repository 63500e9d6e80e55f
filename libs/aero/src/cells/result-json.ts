/**
 * Results as stored and sent: JSON text with every non-integer number kept to RESULT_DIGITS significant
 * digits. `resultJson(value)` gives exactly the text of `JSON.stringify(value, roundedNumber)`, about
 * twice as fast: a replacer takes JSON.stringify off its fast path (a call back into JavaScript for
 * every key and value), and `toPrecision` then `Number` formats and reads back a string per number.
 * Here the numbers are rounded by arithmetic into a copy (the value given is not touched) and the copy
 * is written by plain JSON.stringify.
 */

/** Significant digits results are kept to: beyond single precision, far beyond what the methods resolve. */
export const RESULT_DIGITS = 7;

/** 10^0 … 10^22, each exact in binary64 (5^22 < 2^53). */
const POWERS_OF_TEN = Array.from({ length: 23 }, (_, i) => Number(`1e${i}`));
/** The scaled value holds exactly RESULT_DIGITS digits before the point: LOW ≤ y < HIGH. */
const LOW = POWERS_OF_TEN[RESULT_DIGITS - 1]!;
const HIGH = POWERS_OF_TEN[RESULT_DIGITS]!;

/** |v| · 10^k for |k| ≤ 22: one correctly rounded multiplication or division. */
function scaled(magnitude: number, k: number): number {
  return k >= 0 ? magnitude * POWERS_OF_TEN[k]! : magnitude / POWERS_OF_TEN[-k]!;
}

/**
 * `Number(v.toPrecision(RESULT_DIGITS))` for a finite v, by arithmetic. toPrecision picks the integer n
 * of RESULT_DIGITS digits nearest to |v| · 10^k (ECMA-262, Number.prototype.toPrecision); here
 * y = |v| · 10^k is one correctly rounded operation, so it is within half a unit in its last place
 * (below 1e-9 for y < 10^7) of the exact product, and rounding y gives the same n unless the
 * fraction is within that of ½: such values (and magnitudes whose 10^k is not exact) go to
 * toPrecision itself. The value n / 10^k (or n · 10^−k) is again one correctly rounded operation on
 * exact operands, which is the double nearest the decimal n·10^−k, as reading toPrecision's text is.
 * A test compares the two over millions of values, ties and boundaries.
 */
export function roundToResultDigits(v: number): number {
  const magnitude = v < 0 ? -v : v;
  // 1e-15 ≤ |v| < 1e21 keeps |k| ≤ 22, where 10^k is exact.
  if (!(magnitude >= 1e-15 && magnitude < 1e21)) return Number(v.toPrecision(RESULT_DIGITS));
  // Neighbouring values (a result's arrays) mostly share their scale: try the last one before log10.
  let k = lastScale;
  let y = scaled(magnitude, k);
  if (!(y >= LOW && y < HIGH)) {
    k = RESULT_DIGITS - 1 - Math.floor(Math.log10(magnitude));
    y = scaled(magnitude, k);
    // log10 may be one off next to a power of ten.
    if (y < LOW) y = scaled(magnitude, ++k);
    else if (y >= HIGH) y = scaled(magnitude, --k);
    if (!(y >= LOW && y < HIGH)) return Number(v.toPrecision(RESULT_DIGITS));
    lastScale = k;
  }
  const whole = Math.floor(y);
  const fraction = y - whole;
  if (fraction > 0.5 - TIE_MARGIN && fraction < 0.5 + TIE_MARGIN) return Number(v.toPrecision(RESULT_DIGITS));
  const n = fraction < 0.5 ? whole : whole + 1;
  const rounded = k >= 0 ? n / POWERS_OF_TEN[k]! : n * POWERS_OF_TEN[-k]!;
  return v < 0 ? -rounded : rounded;
}

/** The scale k of the number rounded last (a hint; any k in −22…22 is checked before use). */
let lastScale = 0;

/** Far wider than the error of y (under 1e-9), so only true near-ties take the exact path. */
const TIE_MARGIN = 1e-6;

/** A result number as stored: a non-integer kept to RESULT_DIGITS significant digits; others as they are. */
function roundedValue(v: number): number {
  return Number.isInteger(v) || !Number.isFinite(v) ? v : roundToResultDigits(v);
}

/** A JSON replacer keeping non-integer numbers to RESULT_DIGITS significant digits. */
export function roundedNumber(_key: string, v: unknown): unknown {
  return typeof v === 'number' ? roundedValue(v) : v;
}

/**
 * A copy of a JSON value with its numbers as roundedNumber gives them, so that plain JSON.stringify of
 * the copy is JSON.stringify of the value with roundedNumber. It follows JSON.stringify's own walk:
 * `toJSON` first (with the key), own enumerable string keys in their order, arrays by index; a boxed
 * primitive is left as it is (the replacer sees it as an object, JSON.stringify unboxes it after).
 */
export function roundedCopy(value: unknown, key = ''): unknown {
  if (typeof value === 'number') return roundedValue(value);
  if (typeof value !== 'object' || value === null) return value;
  const toJSON = (value as { toJSON?: unknown }).toJSON;
  // JSON.stringify calls toJSON once and writes what it returns, whatever that holds.
  if (typeof toJSON !== 'function') return copyOfObject(value);
  const json: unknown = toJSON.call(value, key);
  return typeof json === 'number' ? roundedValue(json) : typeof json === 'object' && json !== null ? copyOfObject(json) : json;
}

function copyOfObject(value: object): unknown {
  if (Array.isArray(value)) {
    // A slice keeps the array's kind of storage (unboxed doubles for an array of numbers), which a new
    // array filled item by item would lose at the first null after numbers.
    const out: unknown[] = value.slice();
    const n = out.length;
    for (let i = 0; i < n; i++) {
      const item: unknown = out[i];
      if (typeof item === 'number') {
        if (!Number.isInteger(item) && Number.isFinite(item)) out[i] = roundToResultDigits(item);
      } else if (typeof item === 'object' && item !== null) out[i] = roundedCopy(item, String(i));
    }
    return out;
  }
  if (value instanceof Number || value instanceof String || value instanceof Boolean) return value;
  const out: Record<string, unknown> = {};
  for (const name of Object.keys(value)) {
    const item: unknown = (value as Record<string, unknown>)[name];
    out[name] = typeof item === 'number' ? roundedValue(item) : typeof item === 'object' && item !== null ? roundedCopy(item, name) : item;
  }
  return out;
}

/** The stored text of a result: JSON.stringify(value, roundedNumber), to the character. */
export function resultJson(value: unknown): string {
  return JSON.stringify(roundedCopy(value));
}
