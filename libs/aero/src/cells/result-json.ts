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
  if (!roundDecimal(magnitude)) return Number(v.toPrecision(RESULT_DIGITS));
  const rounded = roundedScale >= 0 ? roundedDigits / POWERS_OF_TEN[roundedScale]! : roundedDigits * POWERS_OF_TEN[-roundedScale]!;
  return v < 0 ? -rounded : rounded;
}

/**
 * The decimal a positive magnitude rounds to, by arithmetic (roundToResultDigits): sets roundedDigits
 * (the integer n, 10^(D−1) ≤ n ≤ 10^D for D = RESULT_DIGITS) and roundedScale (k: the value is
 * n · 10^−k) and answers true; false where only toPrecision can tell (out of range, or a near-tie).
 */
function roundDecimal(magnitude: number): boolean {
  // 1e-15 ≤ |v| < 1e21 keeps |k| ≤ 22, where 10^k is exact.
  if (!(magnitude >= 1e-15 && magnitude < 1e21)) return false;
  // Neighbouring values (a result's arrays) mostly share their scale: try the last one before log10.
  let k = lastScale;
  let y = scaled(magnitude, k);
  if (!(y >= LOW && y < HIGH)) {
    k = RESULT_DIGITS - 1 - Math.floor(Math.log10(magnitude));
    y = scaled(magnitude, k);
    // log10 may be one off next to a power of ten.
    if (y < LOW) y = scaled(magnitude, ++k);
    else if (y >= HIGH) y = scaled(magnitude, --k);
    if (!(y >= LOW && y < HIGH)) return false;
    lastScale = k;
  }
  const whole = Math.floor(y);
  const fraction = y - whole;
  if (fraction > 0.5 - TIE_MARGIN && fraction < 0.5 + TIE_MARGIN) return false;
  roundedDigits = fraction < 0.5 ? whole : whole + 1;
  roundedScale = k;
  return true;
}

/** The scale k of the number rounded last (a hint; any k in −22…22 is checked before use). */
let lastScale = 0;
/** What roundDecimal found last: the digits n and the scale k of n · 10^−k. */
let roundedDigits = 0;
let roundedScale = 0;

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

// ── The same text as bytes, written directly ──────────────────────────────────────────────────────

/**
 * The UTF-8 bytes of resultJson(value), for an object or array of plain data (what the engine's
 * results are), written straight into bytes: about three times faster than rounding a copy and
 * writing it with JSON.stringify (a 2 × 300-station analysis, 58 kB: 0.25 against 0.82 ms, and no
 * encoding of the text after). Every rounded number is written from the decimal it was rounded to:
 * the double nearest n · 10^−k, n of at most RESULT_DIGITS digits, is written by JavaScript (and so by
 * JSON.stringify) as those digits, trailing zeros dropped, since no other decimal of so few digits
 * lies within half a unit in the last place of that double (ECMA-262, Number::toString: the fewest
 * digits that read back as the number), in the notation Number::toString picks by the decimal
 * point's place. Anything but plain objects, arrays, strings, numbers, booleans and null (toJSON,
 * boxed primitives, class instances, a bigint, a cycle) is left to resultJson itself, so the bytes
 * are its text's in every case; a test holds the two against JSON.stringify with the rounding replacer.
 */
export function resultBytes(value: unknown): Uint8Array {
  if (typeof value === 'object' && value !== null) {
    length = 0;
    if (writeValue(value, 0)) return bytes.slice(0, length);
  }
  return encoder.encode(resultJson(value));
}

const encoder = new TextEncoder();
/** Where resultBytes writes (grown as needed, kept for the next call); `length` bytes of it are written. */
let bytes = new Uint8Array(1 << 16);
let length = 0;
/** Deeper than this is left to JSON.stringify (which reports a cycle as a cycle). */
const MAX_DEPTH = 200;
const DIGITS = new Uint8Array(24);
const keyBytes = new Map<string, Uint8Array>();

function room(n: number): void {
  if (length + n <= bytes.length) return;
  const grown = new Uint8Array(Math.max(bytes.length * 2, length + n));
  grown.set(bytes.subarray(0, length));
  bytes = grown;
}

function writeByte(b: number): void {
  room(1);
  bytes[length++] = b;
}

/** Text that JSON has already escaped (a JSON string or a number's text). */
function writeText(text: string): void {
  const n = text.length;
  room(n);
  let i = 0;
  for (; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c >= 0x80) break;
    bytes[length + i] = c;
  }
  if (i === n) {
    length += n;
    return;
  }
  length += i;
  const rest = encoder.encode(text.slice(i));
  room(rest.length);
  bytes.set(rest, length);
  length += rest.length;
}

/** A key as JSON writes it, quoted and escaped, with the colon after it. */
function writeKey(key: string): void {
  let written = keyBytes.get(key);
  if (written === undefined) {
    written = encoder.encode(`${JSON.stringify(key)}:`);
    if (keyBytes.size < 4096) keyBytes.set(key, written);
  }
  room(written.length);
  bytes.set(written, length);
  length += written.length;
}

/** Writes a value; false when it is not plain data (the caller then leaves the whole value to resultJson). */
function writeValue(value: unknown, depth: number): boolean {
  switch (typeof value) {
    case 'number':
      room(NUMBER_ROOM);
      writeNumber(value);
      return true;
    case 'string':
      writeText(JSON.stringify(value));
      return true;
    case 'boolean':
      writeText(value ? 'true' : 'false');
      return true;
    case 'object':
      break;
    default:
      return false;
  }
  if (value === null) {
    writeText('null');
    return true;
  }
  if (depth > MAX_DEPTH) return false;
  const proto: unknown = Object.getPrototypeOf(value);
  if (Array.isArray(value)) return proto === Array.prototype && typeof (value as { toJSON?: unknown }).toJSON !== 'function' && writeArray(value, depth);
  if ((proto !== Object.prototype && proto !== null) || typeof (value as { toJSON?: unknown }).toJSON === 'function') return false;
  return writeObject(value as Record<string, unknown>, depth);
}

/** An array's items (a result's arrays are mostly numbers: those are written in the loop itself). */
function writeArray(value: readonly unknown[], depth: number): boolean {
  writeByte(0x5b); // [
  const n = value.length;
  for (let i = 0; i < n; i++) {
    room(NUMBER_ROOM + 1);
    if (i > 0) bytes[length++] = 0x2c; // ,
    const item: unknown = value[i];
    if (typeof item === 'number') writeNumber(item);
    else if (item === undefined || typeof item === 'function' || typeof item === 'symbol') writeText('null');
    else if (!writeValue(item, depth + 1)) return false;
  }
  writeByte(0x5d); // ]
  return true;
}

function writeObject(value: Record<string, unknown>, depth: number): boolean {
  writeByte(0x7b); // {
  let first = true;
  for (const key of Object.keys(value)) {
    const item: unknown = value[key];
    if (item === undefined || typeof item === 'function' || typeof item === 'symbol') continue;
    if (!first) writeByte(0x2c);
    first = false;
    writeKey(key);
    if (typeof item === 'number') {
      room(NUMBER_ROOM);
      writeNumber(item);
    } else if (!writeValue(item, depth + 1)) return false;
  }
  writeByte(0x7d); // }
  return true;
}

/** Bytes writeNumber may write without asking for room (the most it writes itself: a sign and 21 digits). */
const NUMBER_ROOM = 32;

/** A number as resultJson writes it: JSON's text of roundedValue(v); room(NUMBER_ROOM) first. */
function writeNumber(v: number): void {
  if (Number.isInteger(v)) {
    if (v >= 0 && v < 1e9) writeDigits(v, 0);
    else writeText(String(v === 0 ? 0 : v));
    return;
  }
  if (!Number.isFinite(v)) return writeText('null');
  const magnitude = v < 0 ? -v : v;
  if (!roundDecimal(magnitude)) return writeText(String(Number(v.toPrecision(RESULT_DIGITS))));
  if (v < 0) bytes[length++] = 0x2d; // -
  writeDigits(roundedDigits, roundedScale);
}

/**
 * n · 10^−k (n a positive integer below 10^9, or 0) in the notation of Number::toString (ECMA-262):
 * with d the digits of n less trailing zeros and p where the decimal point falls after the first
 * digit (n · 10^−k = 0.d · 10^p), plain digits for p up to 21, a leading "0." for p down to −5, and
 * otherwise d₁.d₂…e±(p − 1).
 */
function writeDigits(n: number, k: number): void {
  // Locals for the buffer and its length: the module's `bytes` and `length` are context slots, which
  // every store would otherwise go through (this runs for every number of a result).
  const b = bytes;
  const d = DIGITS;
  let at = length;
  if (n === 0) {
    b[at] = 0x30;
    length = at + 1;
    return;
  }
  let count = 0;
  // n < 10^9 < 2^31: int32 arithmetic (a double's % would be a call to fmod).
  for (let rest = n | 0; rest > 0; ) {
    const tenth = (rest / 10) | 0;
    d[count++] = 0x30 + rest - tenth * 10;
    rest = tenth;
  }
  // d holds the digits last first; drop the trailing zeros (the first ones held).
  let last = 0;
  while (d[last] === 0x30) last++;
  const m = count - last;
  const p = count - k;
  if (p >= m && p <= 21) {
    for (let i = count - 1; i >= last; i--) b[at++] = d[i]!;
    for (let i = m; i < p; i++) b[at++] = 0x30;
  } else if (p > 0 && p <= 21) {
    for (let i = count - 1, j = 0; i >= last; i--, j++) {
      if (j === p) b[at++] = 0x2e; // .
      b[at++] = d[i]!;
    }
  } else if (p > -6 && p <= 0) {
    b[at++] = 0x30;
    b[at++] = 0x2e;
    for (let i = p; i < 0; i++) b[at++] = 0x30;
    for (let i = count - 1; i >= last; i--) b[at++] = d[i]!;
  } else {
    b[at++] = d[count - 1]!;
    if (m > 1) {
      b[at++] = 0x2e;
      for (let i = count - 2; i >= last; i--) b[at++] = d[i]!;
    }
    b[at++] = 0x65; // e
    const exponent = p - 1;
    b[at++] = exponent < 0 ? 0x2d : 0x2b;
    length = at;
    writeExponent(exponent < 0 ? -exponent : exponent);
    return;
  }
  length = at;
}

function writeExponent(e: number): void {
  if (e >= 100) bytes[length++] = 0x30 + Math.floor(e / 100);
  if (e >= 10) bytes[length++] = 0x30 + (Math.floor(e / 10) % 10);
  bytes[length++] = 0x30 + (e % 10);
}
