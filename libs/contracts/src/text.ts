import { z } from 'zod';
import { isUuid } from './values';

/**
 * Safe text and safe JSON: what the API accepts from anyone, decided once. PostgreSQL stores neither
 * U+0000 (in text or jsonb) nor an unpaired UTF-16 surrogate (jsonb refuses the `\ud800` escape; a text
 * column would silently get U+FFFD instead), a number that is not finite becomes `null` in JSON, and
 * nesting thousands deep exhausts the stack of anything recursive. Each is refused with a message
 * that names the field by its label on screen.
 */

/** Deepest nesting of objects and arrays accepted in a request body (a study's deepest real input is 4). */
export const JSON_DEPTH_LIMIT = 32;

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** What is wrong with a piece of text, or null when it can be stored as it is. */
export function textFault(text: string): string | null {
  if (text.includes('\u0000')) return 'must not contain the NUL character (U+0000)';
  if (LONE_SURROGATE.test(text)) return 'contains broken Unicode (an unpaired UTF-16 surrogate)';
  return null;
}

/**
 * A string that PostgreSQL can store as it is: no NUL, no unpaired surrogate. `label` is the field's
 * name on screen.
 */
export function safeText(label: string) {
  return z.string({ error: `${label} must be text` }).superRefine((text, ctx) => {
    const fault = textFault(text);
    if (fault) ctx.addIssue({ code: 'custom', message: `${label} ${fault}` });
  });
}

/** A number that JSON and PostgreSQL keep as given: 1e309 parses as Infinity and would be saved as null. */
export function finiteNumber(label: string) {
  return z.number({ error: `${label} must be a number` }).finite(`${label} must be a finite number`);
}

/** Whether `value` has the form of the ids Laminote gives out (UUIDs). */
export function isId(value: string): boolean {
  return isUuid(value);
}

/**
 * What the path parameters of the API name, in the words of the screens. Every `:…Id` parameter of a
 * route is checked against this (server/src/http/path-ids.ts); a new one needs a label here.
 */
export const PATH_ID_LABELS: Readonly<Record<string, string>> = {
  projectId: 'project',
  studyId: 'study',
  branchId: 'branch',
  versionId: 'version',
  cellId: 'cell',
  userId: 'person',
  uploadId: 'uploaded file',
  threadId: 'comment thread',
  commentId: 'comment',
  notificationId: 'notification',
  tokenId: 'API token',
  reportId: 'report',
};

/** Labels of request fields as the screens show them; a field not listed is shown by its name in words. */
export const REQUEST_FIELD_LABELS: Readonly<Record<string, string>> = {
  title: 'Title',
  description: 'Description',
  name: 'Name',
  email: 'E-mail',
  leadEmail: 'Lead e-mail',
  role: 'Role',
  body: 'Comment',
  message: 'Message',
  markdown: 'Note',
  text: 'Table',
  filename: 'File name',
  surfaceName: 'Surface name',
  cells: 'Cells',
  inputs: 'Inputs',
  settings: 'Settings',
  purpose: 'Purpose',
  label: 'Label',
  summary: 'Summary',
  verdict: 'Verdict',
};

/** `leadingEdgeRadius` → `leading edge radius`: a field without a label, in words. */
function inWords(key: string): string {
  return key
    .replace(/_.*$/, '')
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase();
}

/**
 * A request path (`cells[2].inputs.reynolds`) as people read it: `Cell 3 · Reynolds number`. `inputLabel`
 * gives a cell input's label on screen when the caller knows the cell's kind.
 */
export function requestFieldLabel(path: readonly (string | number)[], inputLabel?: (cellIndex: number, key: string) => string | undefined): string {
  const parts: string[] = [];
  for (let i = 0; i < path.length; i++) {
    const key = path[i]!;
    const next = path[i + 1];
    if (key === 'cells' && typeof next === 'number') {
      parts.push(`Cell ${next + 1}`);
      i++;
      if (path[i + 1] === 'inputs' && typeof path[i + 2] === 'string') {
        const input = path[i + 2] as string;
        parts.push(inputLabel?.(next, input) ?? inWords(input));
        i += 2;
      }
      continue;
    }
    if (typeof key === 'number') parts.push(`item ${key + 1}`);
    else parts.push(REQUEST_FIELD_LABELS[key] ?? inWords(key));
  }
  if (parts.length === 0) return 'The request';
  const first = parts[0]!;
  parts[0] = first.charAt(0).toUpperCase() + first.slice(1);
  return parts.join(' · ');
}

export interface JsonFault {
  path: (string | number)[];
  /** Says what is wrong, to follow the field's label. */
  message: string;
}

/**
 * The first thing in a parsed JSON value (a request body or query) that cannot be stored as given:
 * text or a key with NUL or an unpaired surrogate, a number that is not finite, nesting deeper than
 * `maxDepth`. Iterative, so hostile depth cannot exhaust the stack here.
 */
export function jsonFault(value: unknown, maxDepth = JSON_DEPTH_LIMIT): JsonFault | null {
  const stack: { value: unknown; path: (string | number)[] }[] = [{ value, path: [] }];
  while (stack.length > 0) {
    const { value: v, path } = stack.pop()!;
    if (typeof v === 'string') {
      const fault = textFault(v);
      if (fault) return { path, message: fault };
    } else if (typeof v === 'number') {
      if (!Number.isFinite(v)) return { path, message: 'must be a finite number' };
    } else if (v !== null && typeof v === 'object') {
      if (path.length >= maxDepth) return { path, message: `is nested too deeply (more than ${maxDepth} levels)` };
      if (Array.isArray(v)) {
        for (let i = v.length - 1; i >= 0; i--) stack.push({ value: v[i], path: [...path, i] });
      } else {
        const entries = Object.entries(v);
        for (let i = entries.length - 1; i >= 0; i--) {
          const [key, inner] = entries[i]!;
          const fault = textFault(key);
          if (fault) return { path, message: `has a field name that ${fault}` };
          stack.push({ value: inner, path: [...path, key] });
        }
      }
    }
  }
  return null;
}
