/**
 * Small plain helpers that web and server both need, written once. Zod-free.
 */

/** A UUID as ids are written in addresses and inputs (any version), case-insensitive. */
export const UUID_PATTERN = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID_PATTERN.test(value);
}

/** Structural equality of JSON values, blind to key order (stored inputs may keep keys in another order). */
export function sameJson(a: unknown, b: unknown): boolean {
  if (Object.is(a, b)) return true;
  if (typeof a !== typeof b || a === null || b === null || typeof a !== 'object') return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const other = b as unknown[];
    return a.length === other.length && a.every((item, i) => sameJson(item, other[i]));
  }
  const left = a as Record<string, unknown>;
  const right = b as Record<string, unknown>;
  const keys = new Set([...Object.keys(left), ...Object.keys(right)]);
  for (const key of keys) if (!sameJson(left[key], right[key])) return false;
  return true;
}

const SUPERSCRIPT: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };

/** 10 to a power as the trade writes it: 10⁻³. */
export function powerOfTen(exponent: number): string {
  return `10${String(exponent)
    .split('')
    .map((c) => SUPERSCRIPT[c] ?? c)
    .join('')}`;
}

/**
 * A number as Laminote shows it: to `digits` significant digits, plain when 0.01 ≤ |x| < 10⁵, else in
 * engineering notation (2.31 × 10⁷). `trim` drops trailing zeros (an input given as 6e6 reads
 * 6 × 10⁶); without it the digits stay, as a result's precision is part of what it says.
 */
export function sci(value: number | null | undefined, digits = 3, trim = false): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const magnitude = Math.abs(value);
  if (magnitude === 0) return '0';
  if (magnitude >= 0.01 && magnitude < 1e5) return Number(value.toPrecision(digits)).toString();
  const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
  return `${trim ? String(Number(mantissa)) : mantissa} × ${powerOfTen(Number(exponent))}`;
}

/**
 * The branch a study opens on: the one `wanted` names (by id or by name), or without a name `main`, else
 * the first branch not archived, else the first. Undefined when a name matches none (or there is none).
 * GET /api/studies/:studyId/opening chooses with this; the notebook page opens the branch it answers with.
 */
export function pickBranch<B extends { readonly id: string; readonly name: string; readonly archived: boolean }>(branches: readonly B[], wanted?: string | null): B | undefined {
  if (wanted) return branches.find((b) => b.id === wanted || b.name === wanted);
  return branches.find((b) => b.name === 'main') ?? branches.find((b) => !b.archived) ?? branches[0];
}
