import { createHash } from 'node:crypto';
import { canonicalJson } from '../notebook/plan';

/**
 * The content hash of a cell revision: SHA-256 of its kind, title and inputs (canonical JSON, keys
 * sorted). A cell unchanged since the last version hashes the same and reuses its revision row.
 */
export function cellContentHash(cell: { kind: string; title: string; inputs: Record<string, unknown> }): string {
  return createHash('sha256').update(canonicalJson({ kind: cell.kind, title: cell.title, inputs: cell.inputs })).digest('hex');
}
