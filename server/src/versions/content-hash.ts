import { createHash } from 'node:crypto';

/** JSON with object keys sorted, so equal content always gives the same text. */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value ?? null);
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/**
 * The content hash of a cell revision: SHA-256 of its kind, title and inputs. A cell unchanged since
 * the last version hashes the same and reuses its revision row.
 */
export function cellContentHash(cell: { kind: string; title: string; inputs: Record<string, unknown> }): string {
  return createHash('sha256').update(canonicalJson({ kind: cell.kind, title: cell.title, inputs: cell.inputs })).digest('hex');
}
