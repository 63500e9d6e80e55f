/**
 * Reader for pasted or uploaded pressure tables: rows of `x cp` or `x y cp`.
 *
 * Fields are separated by tabs, commas, semicolons or spaces; `#` starts a comment to the end of the
 * line. A table whose fields are separated by semicolons or tabs and whose numbers are written with a
 * decimal comma (`0,25;-0,41`, as spreadsheets export in much of Europe) is read with the comma as the
 * decimal mark, when no number in it has a decimal point; blank lines are skipped; one header row naming the columns is allowed before the data (names
 * such as `x`, `x/c`, `y`, `z/c`, `cp`, `Cp`, `-cp`, in any order; `-cp` columns are negated).
 * Without a header, two columns are `x cp` and three are `x y cp`. A table of an axisymmetric body
 * (`radius: true`) needs a header that also names a body-radius column (`r`, `r/c`, `rc`, `r/l` or
 * `radius`). Every problem names its line (1-based; line 0 means the table as a whole) so the
 * notebook can show it beside the text. This is the one reader of tables: the notebook's preview,
 * the server and the command line all read through it.
 */

export interface PressureTableRow {
  /** 1-based line number in the pasted text. */
  line: number;
  x: number;
  /** null when the table has no y column. */
  y: number | null;
  cp: number;
  /** Body radius, read only when the table is read with `radius: true`. */
  r?: number;
}

export interface PressureTableProblem {
  /** 1-based line number; 0 means the table as a whole. */
  line: number;
  message: string;
}

export type PressureTableParse =
  | { ok: true; rows: PressureTableRow[]; hasY: boolean; headerLine: number | null }
  | { ok: false; problems: PressureTableProblem[] };

export interface PressureTableOptions {
  /** Refuse tables with more data rows than this (default 200 000). */
  maxRows?: number;
  /**
   * List at most this many problems (default 20); the rest are counted in one closing problem ("and
   * N more lines with problems").
   */
  maxProblems?: number;
  /** Read a body-radius column too (axisymmetric bodies); the header must name it. */
  radius?: boolean;
}

/** Header names of a body-radius column, compared in lower case. */
export const RADIUS_COLUMN_NAMES: readonly string[] = ['r', 'r/c', 'rc', 'r/l', 'radius'];

const FIELD_SEPARATOR = /\s*[,;\t]\s*|\s+/;
/** With a decimal comma only semicolons and tabs separate fields. */
const DECIMAL_COMMA_SEPARATOR = /\s*[;\t]\s*/;
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;
const DECIMAL_COMMA_NUMBER = /^[+-]?\d*,\d+(?:[eE][+-]?\d+)?$/;

/**
 * Whether the table writes numbers with a decimal comma: its data lines are separated by semicolons
 * or tabs, some field reads as a decimal-comma number, and no number has a decimal point.
 */
export function usesDecimalComma(lines: readonly string[]): boolean {
  let commaNumbers = 0;
  for (const raw of lines) {
    const hash = raw.indexOf('#');
    const content = (hash >= 0 ? raw.slice(0, hash) : raw).trim();
    if (content === '' || !/\d/.test(content)) continue;
    if (/\d\.\d|^\.\d|[;\t\s]\.\d/.test(content)) return false;
    if (!/[;\t]/.test(content)) continue;
    for (const field of content.split(DECIMAL_COMMA_SEPARATOR)) if (DECIMAL_COMMA_NUMBER.test(field.replace(/^"|"$/g, ''))) commaNumbers++;
  }
  return commaNumbers > 0;
}

type Column = 'x' | 'y' | 'cp' | 'minusCp';

function columnOf(name: string): Column | null {
  const key = name.toLowerCase().replace(/[\s_()[\]]/g, '');
  if (key === 'x' || key === 'x/c' || key === 'xc' || key === 'x/l' || key === 's') return 'x';
  if (key === 'y' || key === 'y/c' || key === 'yc' || key === 'z' || key === 'z/c' || key === 'zc') return 'y';
  if (key === 'cp' || key === 'c_p' || key === 'cpressure') return 'cp';
  if (key === '-cp') return 'minusCp';
  return null;
}

function parseNumber(text: string, decimalComma = false): number {
  if (decimalComma && DECIMAL_COMMA_NUMBER.test(text)) return Number(text.replace(',', '.'));
  // Most numbers are plain (no Fortran exponent): read without the two regular expressions.
  if (isPlainNumber(text)) return Number(text);
  return NUMBER.test(text) ? Number(text.replace(/[dD]/, 'e')) : NaN;
}

const DIGIT_0 = 48;
const DIGIT_9 = 57;
const PLUS = 43;
const MINUS = 45;
const POINT = 46;
const LOWER_E = 101;
const UPPER_E = 69;
const SPACE = 32;
const TAB = 9;

/** Whether `text` is a NUMBER written with `e` or `E` (or no) exponent: [+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?. */
function isPlainNumber(text: string): boolean {
  const n = text.length;
  let i = 0;
  let c = text.charCodeAt(0);
  if (c === PLUS || c === MINUS) c = text.charCodeAt(++i);
  let whole = 0;
  while (c >= DIGIT_0 && c <= DIGIT_9) {
    whole++;
    c = text.charCodeAt(++i);
  }
  let fraction = 0;
  if (c === POINT) {
    c = text.charCodeAt(++i);
    while (c >= DIGIT_0 && c <= DIGIT_9) {
      fraction++;
      c = text.charCodeAt(++i);
    }
  } else if (whole === 0) return false;
  if (whole === 0 && fraction === 0) return false;
  if (c === LOWER_E || c === UPPER_E) {
    c = text.charCodeAt(++i);
    if (c === PLUS || c === MINUS) c = text.charCodeAt(++i);
    let exponent = 0;
    while (c >= DIGIT_0 && c <= DIGIT_9) {
      exponent++;
      c = text.charCodeAt(++i);
    }
    if (exponent === 0) return false;
  }
  return i === n;
}

/**
 * The fields of a trimmed line of numbers-like characters (digits, point, signs, e and E) separated by
 * spaces and tabs, as FIELD_SEPARATOR splits it (each run of spaces and tabs is one separator); null
 * for any other line, which splitFields reads.
 */
function plainFields(content: string): string[] | null {
  const fields: string[] = [];
  let start = 0;
  const n = content.length;
  for (let i = 0; i < n; i++) {
    const c = content.charCodeAt(i);
    if (c === SPACE || c === TAB) {
      if (start < i) fields.push(content.slice(start, i));
      start = i + 1;
    } else if (!((c >= DIGIT_0 && c <= DIGIT_9) || c === POINT || c === MINUS || c === PLUS || c === LOWER_E || c === UPPER_E)) {
      return null;
    }
  }
  fields.push(content.slice(start));
  return fields;
}

function splitFields(content: string, decimalComma = false): string[] {
  if (!decimalComma) {
    const plain = plainFields(content);
    if (plain !== null) return plain;
  }
  let trimmed = content.trim();
  // A separator at the end of a row (spreadsheet exports) does not open a field.
  if ((decimalComma ? /;$/ : /[,;]$/).test(trimmed)) trimmed = trimmed.slice(0, -1).trimEnd();
  // Spreadsheet exports may quote every field.
  return trimmed
    .split(decimalComma ? DECIMAL_COMMA_SEPARATOR : FIELD_SEPARATOR)
    .map((field) => (field.length >= 2 && field.startsWith('"') && field.endsWith('"') ? field.slice(1, -1).trim() : field));
}

/** Parse a pressure table; see the module comment for the accepted layout. */
export function parsePressureTable(text: string, options: PressureTableOptions = {}): PressureTableParse {
  const maxRows = options.maxRows ?? 200_000;
  const maxProblems = options.maxProblems ?? 20;
  const problems: PressureTableProblem[] = [];
  const rows: PressureTableRow[] = [];
  const unmarked = text.replace(/^\uFEFF/, '');
  // Without a carriage return the three line ends are one.
  const lines = unmarked.includes('\r') ? unmarked.split(/\r\n|\r|\n/) : unmarked.split('\n');
  const decimalComma = usesDecimalComma(lines);
  const read = (field: string) => parseNumber(field, decimalComma);
  // Problems past the listed ones are only counted.
  let unlisted = 0;
  const listProblem = (problem: PressureTableProblem) => {
    if (problems.length < maxProblems) problems.push(problem);
    else unlisted++;
  };

  let layout: { x: number; y: number; cp: number; cpSign: number; r: number; count: number; definedAt: number } | null = null;
  let headerLine: number | null = null;
  let names: string[] = [];

  for (let index = 0; index < lines.length; index++) {
    const line = index + 1;
    const hash = lines[index].indexOf('#');
    const content = (hash >= 0 ? lines[index].slice(0, hash) : lines[index]).trim();
    if (content === '') continue;
    const fields = splitFields(content, decimalComma);

    if (layout === null) {
      const values = fields.map(read);
      if (values.every(Number.isNaN) && headerLine === null && rows.length === 0 && /[a-zA-Z]/.test(content)) {
        headerLine = line;
        names = fields;
        continue;
      }
      const header = headerLine === null ? null : names.map(columnOf);
      const fromHeader = header === null ? null : layoutFromHeader(header, fields.length);
      if (header !== null && fromHeader === null) {
        problems.push({ line: headerLine!, message: `header "${names.join(' ')}" does not say which columns are x and cp (name them x, y, cp)` });
        break;
      }
      if (options.radius && headerLine === null) {
        problems.push({ line, message: 'with a body radius the table needs a header row naming its columns, e.g. "x r cp"' });
        break;
      }
      const r = options.radius ? names.findIndex((name) => RADIUS_COLUMN_NAMES.includes(name.toLowerCase())) : -1;
      if (options.radius && r < 0) {
        problems.push({ line: headerLine!, message: `the header "${names.join(' ')}" names no radius column (call it r)` });
        break;
      }
      if (fromHeader !== null) {
        layout = { ...fromHeader, r, count: names.length, definedAt: headerLine! };
        if (fields.length !== names.length) {
          listProblem({ line, message: `${fields.length} values, but the header on line ${headerLine} names ${names.length} columns` });
          continue;
        }
      } else if (fields.length === 2) {
        layout = { x: 0, y: -1, cp: 1, cpSign: 1, r: -1, count: 2, definedAt: line };
      } else if (fields.length === 3) {
        layout = { x: 0, y: 1, cp: 2, cpSign: 1, r: -1, count: 3, definedAt: line };
      } else {
        problems.push({ line, message: `expected 2 values (x cp) or 3 values (x y cp), found ${fields.length}${decimalCommaHint(content)}` });
        break;
      }
    }

    if (fields.length !== layout.count) {
      listProblem({ line, message: `${fields.length} values, expected ${layout.count} as on line ${layout.definedAt}${decimalCommaHint(content)}` });
      continue;
    }
    const columnNames = layout.y >= 0 ? ['x', 'y', 'cp'] : ['x', 'cp'];
    const picked = layout.y >= 0 ? [layout.x, layout.y, layout.cp] : [layout.x, layout.cp];
    const values: number[] = [];
    let bad = false;
    for (let k = 0; k < picked.length; k++) {
      const field = fields[picked[k]];
      const value = field === '' ? NaN : read(field);
      if (Number.isNaN(value)) {
        listProblem({ line, message: field === '' ? `empty ${columnNames[k]} value` : `"${field}" is not a number (${columnNames[k]})` });
        bad = true;
        break;
      }
      if (!Number.isFinite(value)) {
        listProblem({ line, message: `${columnNames[k]} value "${field}" is out of range` });
        bad = true;
        break;
      }
      values.push(value);
    }
    if (bad) continue;
    let radius: number | undefined;
    if (layout.r >= 0) {
      radius = read(fields[layout.r]);
      if (!(radius >= 0) || !Number.isFinite(radius)) {
        listProblem({ line, message: `the radius "${fields[layout.r]}" is not a non-negative number` });
        continue;
      }
    }
    if (rows.length >= maxRows) {
      listProblem({ line, message: `more than ${maxRows} data rows (limit)` });
      break;
    }
    const row: PressureTableRow =
      layout.y >= 0 ? { line, x: values[0], y: values[1], cp: layout.cpSign * values[2] } : { line, x: values[0], y: null, cp: layout.cpSign * values[1] };
    if (radius !== undefined) row.r = radius;
    rows.push(row);
  }

  if (unlisted > 0) problems.push({ line: 0, message: `and ${unlisted} more ${unlisted === 1 ? 'line' : 'lines'} with problems, not listed` });
  if (problems.length > 0) return { ok: false, problems };
  if (rows.length === 0) {
    return { ok: false, problems: [{ line: headerLine ?? 0, message: headerLine === null ? 'the table has no data rows' : 'the table has a header but no data rows' }] };
  }
  return { ok: true, rows, hasY: layout !== null && layout.y >= 0, headerLine };
}

/** A parse as `keptPressureTable` shares it: frozen, so no reader can change it under the next. */
export type KeptPressureTableParse =
  | { readonly ok: true; readonly rows: readonly Readonly<PressureTableRow>[]; readonly hasY: boolean; readonly headerLine: number | null }
  | { readonly ok: false; readonly problems: readonly Readonly<PressureTableProblem>[] };

/** Tables kept by keptPressureTable, most recently read last; texts longer than KEPT_TEXT_LIMIT are not kept. */
const keptTables = new Map<string, { options: string; parse: KeptPressureTableParse }[]>();
const KEPT_TABLES = 8;
const KEPT_TEXT_LIMIT = 1 << 18;

/**
 * parsePressureTable for the engine's own analyses, which read the same table again and again (each run
 * of a study with a changed flow, each case of a sweep): the last few texts' parses are kept and shared,
 * frozen. The parse of a text is the same every time, so a kept one is the one a fresh read would give.
 */
export function keptPressureTable(text: string, options: PressureTableOptions = {}): KeptPressureTableParse {
  const optionsKey = `${options.maxRows ?? ''}|${options.maxProblems ?? ''}|${options.radius ? 1 : 0}`;
  const entries = keptTables.get(text);
  const kept = entries?.find((entry) => entry.options === optionsKey);
  if (kept) {
    // Most recently used last: the first key is the one to drop.
    keptTables.delete(text);
    keptTables.set(text, entries!);
    return kept.parse;
  }
  const parse = frozen(parsePressureTable(text, options));
  if (text.length <= KEPT_TEXT_LIMIT) {
    if (entries) entries.push({ options: optionsKey, parse });
    else {
      if (keptTables.size >= KEPT_TABLES) keptTables.delete(keptTables.keys().next().value!);
      keptTables.set(text, [{ options: optionsKey, parse }]);
    }
  }
  return parse;
}

function frozen(parse: PressureTableParse): KeptPressureTableParse {
  if (parse.ok) for (const row of parse.rows) Object.freeze(row);
  else for (const problem of parse.problems) Object.freeze(problem);
  Object.freeze(parse.ok ? parse.rows : parse.problems);
  return Object.freeze(parse);
}

function layoutFromHeader(header: (Column | null)[], width: number): { x: number; y: number; cp: number; cpSign: number } | null {
  const x = header.indexOf('x');
  const y = header.indexOf('y');
  const cp = header.indexOf('cp');
  const minusCp = header.indexOf('minusCp');
  const cpColumn = cp >= 0 ? cp : minusCp;
  if (x >= 0 && cpColumn >= 0) return { x, y, cp: cpColumn, cpSign: cp >= 0 ? 1 : -1 };
  // Unrecognised names on a plain two- or three-column table: read it by position.
  if (header.length === width && (width === 2 || width === 3) && header.every((c) => c === null)) {
    return width === 2 ? { x: 0, y: -1, cp: 1, cpSign: 1 } : { x: 0, y: 1, cp: 2, cpSign: 1 };
  }
  return null;
}

function decimalCommaHint(content: string): string {
  return content.includes(';') && content.includes(',') ? ' (decimal commas are not read; use a decimal point)' : '';
}

/**
 * Why a file's bytes are not a text table, or null when they may be one: a NUL byte, or a control
 * character text never holds (below space, except tab, line feed, form feed and carriage return; and
 * DEL). Spreadsheet workbooks, images and archives always have some; a table saved as CSV or text has
 * none. The notebook checks before it uploads, the server again before it stores.
 */
export function binaryTableFault(bytes: Uint8Array): string | null {
  const limit = Math.min(bytes.length, 1 << 20);
  for (let i = 0; i < limit; i++) {
    const b = bytes[i]!;
    if (b === 0) return 'holds binary data (NUL bytes)';
    if ((b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0c && b !== 0x0d) || b === 0x7f) return `holds binary data (control byte 0x${b.toString(16).padStart(2, '0')} at byte ${i + 1})`;
  }
  return null;
}
