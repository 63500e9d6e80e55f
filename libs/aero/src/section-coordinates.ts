/**
 * Reader for pasted or uploaded section coordinates, rows of `x y`.
 *
 * Fields are separated by tabs, commas, semicolons or spaces; `#` starts a comment; blank lines are
 * skipped except as the break between two surfaces. A first line that is not two numbers is taken as
 * the section's title (common practice in coordinate files), as is a header row `x y`. Two layouts are
 * read (common practice):
 *  - a closed loop from the trailing edge over one surface round the nose and back along the other;
 *  - two surfaces, each from the leading edge to the trailing edge, one after the other (with or without a
 *    blank line between); the one lying higher is the upper surface.
 * A row of two counts before two-surface data (e.g. `61. 61.`, larger than any coordinate) is skipped.
 * The result is always the loop, trailing edge → upper surface → nose → lower surface → trailing edge.
 * Every problem names its 1-based line (0 for the text as a whole); the text itself is never changed.
 */

export interface CoordinateProblem {
  line: number;
  message: string;
}

export type CoordinateParse =
  | { ok: true; x: number[]; y: number[]; lines: number[]; title: string | null; layout: 'loop' | 'twoSurfaces'; warnings: string[] }
  | { ok: false; problems: CoordinateProblem[] };

export interface CoordinateOptions {
  maxRows?: number;
  maxProblems?: number;
}

const FIELD_SEPARATOR = /\s*[,;\t]\s*|\s+/;
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;

function parseNumber(text: string): number {
  return NUMBER.test(text) ? Number(text.replace(/[dD]/, 'e')) : NaN;
}

interface Row {
  line: number;
  x: number;
  y: number;
  /** A blank line came before this row (after some data). */
  afterBreak: boolean;
}

export function parseSectionCoordinates(text: string, options: CoordinateOptions = {}): CoordinateParse {
  const maxRows = options.maxRows ?? 20_000;
  const maxProblems = options.maxProblems ?? 20;
  const problems: CoordinateProblem[] = [];
  const rows: Row[] = [];
  let title: string | null = null;
  let sawBlank = false;
  const lines = text.split(/\r\n|\n|\r/);
  for (let index = 0; index < lines.length && problems.length < maxProblems; index++) {
    const lineNumber = index + 1;
    const raw = lines[index];
    if (raw.includes('\u0000')) {
      problems.push({ line: lineNumber, message: 'contains a NUL character' });
      continue;
    }
    const content = raw.replace(/#.*$/, '').trim();
    if (content === '') {
      if (rows.length > 0) sawBlank = true;
      continue;
    }
    const fields = content.replace(/[,;]$/, '').trim().split(FIELD_SEPARATOR);
    const numbers = fields.map(parseNumber);
    const numeric = numbers.every((v) => Number.isFinite(v));
    if (!numeric && rows.length === 0 && title === null && problems.length === 0) {
      title = content.slice(0, 120);
      continue;
    }
    if (fields.length !== 2) {
      problems.push({ line: lineNumber, message: `expected two numbers, x and y, found ${fields.length} field${fields.length === 1 ? '' : 's'}` });
      continue;
    }
    if (!numeric) {
      const bad = fields[numbers.findIndex((v) => !Number.isFinite(v))];
      problems.push({ line: lineNumber, message: `"${bad.slice(0, 40)}" is not a number` });
      continue;
    }
    if (Math.abs(numbers[0]) > 1e6 || Math.abs(numbers[1]) > 1e6) {
      problems.push({ line: lineNumber, message: 'a coordinate above 1e6 is outside the range read' });
      continue;
    }
    if (rows.length >= maxRows) {
      problems.push({ line: lineNumber, message: `more than ${maxRows} points (limit)` });
      break;
    }
    rows.push({ line: lineNumber, x: numbers[0], y: numbers[1], afterBreak: sawBlank });
    sawBlank = false;
  }
  if (problems.length > 0) return { ok: false, problems };
  // A leading pair of point counts (two-surface files): both integers larger than the coordinates.
  if (rows.length > 2 && Number.isInteger(rows[0].x) && Number.isInteger(rows[0].y) && rows[0].x > 2 && rows[0].y > 2) {
    const counts = rows.shift()!;
    if (rows.length !== counts.x + counts.y) {
      return { ok: false, problems: [{ line: counts.line, message: `the counts say ${counts.x} + ${counts.y} points but ${rows.length} follow` }] };
    }
    if (rows[counts.x] !== undefined) rows[counts.x].afterBreak = true;
  }
  if (rows.length < 5) return { ok: false, problems: [{ line: rows.at(-1)?.line ?? 0, message: `needs at least 5 points, found ${rows.length}` }] };

  const warnings: string[] = [];
  const split = twoSurfaceSplit(rows);
  let ordered: Row[];
  let layout: 'loop' | 'twoSurfaces';
  if (split !== null) {
    layout = 'twoSurfaces';
    const first = rows.slice(0, split);
    const second = rows.slice(split);
    for (const surface of [first, second]) {
      for (let i = 1; i < surface.length; i++) {
        if (!(surface[i].x >= surface[i - 1].x)) {
          return { ok: false, problems: [{ line: surface[i].line, message: `x goes back (${surface[i].x} after ${surface[i - 1].x}) within a surface that should run from the nose to the trailing edge` }] };
        }
      }
    }
    const firstHigher = meanY(first) >= meanY(second);
    const upper = firstHigher ? first : second;
    const lower = firstHigher ? second : first;
    // Loop: upper reversed (trailing edge to nose), then lower without a repeated nose point.
    const nose = upper[0];
    const lowerStart = Math.hypot(lower[0].x - nose.x, lower[0].y - nose.y) < 1e-9 ? 1 : 0;
    ordered = [...upper.slice().reverse(), ...lower.slice(lowerStart)];
  } else {
    layout = 'loop';
    ordered = rows;
    const leading = indexOfMinX(rows);
    if (leading === 0 || leading === rows.length - 1) {
      return { ok: false, problems: [{ line: rows[leading].line, message: 'the foremost point is at an end of the list: give a closed loop from the trailing edge round the nose and back, or two surfaces from the nose' }] };
    }
    for (let i = 1; i < rows.length; i++) {
      const forward = i <= leading;
      if (forward ? rows[i].x > rows[i - 1].x : rows[i].x < rows[i - 1].x) {
        return { ok: false, problems: [{ line: rows[i].line, message: `x ${forward ? 'rises' : 'falls'} (${rows[i].x} after ${rows[i - 1].x}) where the loop should run ${forward ? 'forward to the nose' : 'back to the trailing edge'}` }] };
      }
    }
    const before = rows.slice(0, leading + 1);
    const after = rows.slice(leading);
    if (meanY(before) < meanY(after)) {
      ordered = rows.slice().reverse();
      warnings.push('the loop runs over the lower surface first; it is read in the other direction');
    }
  }
  for (let i = 1; i < ordered.length; i++) {
    if (ordered[i].x === ordered[i - 1].x && ordered[i].y === ordered[i - 1].y) {
      return { ok: false, problems: [{ line: ordered[i].line, message: 'repeats the point before it' }] };
    }
  }
  return { ok: true, x: ordered.map((r) => r.x), y: ordered.map((r) => r.y), lines: ordered.map((r) => r.line), title, layout, warnings };
}

function meanY(rows: readonly Row[]): number {
  return rows.reduce((sum, r) => sum + r.y, 0) / rows.length;
}

function indexOfMinX(rows: readonly Row[]): number {
  let best = 0;
  for (let i = 1; i < rows.length; i++) if (rows[i].x < rows[best].x) best = i;
  return best;
}

/** Index where a second nose-to-tail surface starts, or null for a loop. */
function twoSurfaceSplit(rows: readonly Row[]): number | null {
  const span = Math.max(...rows.map((r) => r.x)) - Math.min(...rows.map((r) => r.x));
  // A loop starts at the trailing edge (x near its largest); two surfaces start at the nose.
  if (rows[0].x - Math.min(...rows.map((r) => r.x)) > 0.5 * span) return null;
  const blank = rows.findIndex((r, i) => i > 0 && r.afterBreak);
  if (blank > 0) return blank;
  for (let i = 1; i < rows.length; i++) {
    if (rows[i - 1].x - rows[i].x > 0.5 * span) return i;
  }
  return null;
}

/**
 * Unit-chord form of a loop: the leading edge (the point farthest from the trailing-edge midpoint) moves
 * to (0, 0), the trailing-edge midpoint to (1, 0); rotation removes any incidence built into the
 * coordinates. Returns the chord and twist it removed so the screen can say so.
 */
export function normalizeSection(x: readonly number[], y: readonly number[]): { x: number[]; y: number[]; chord: number; twistDeg: number } {
  const n = x.length;
  const teX = 0.5 * (x[0] + x[n - 1]);
  const teY = 0.5 * (y[0] + y[n - 1]);
  let leading = 0;
  let far = -1;
  for (let i = 0; i < n; i++) {
    const d = Math.hypot(x[i] - teX, y[i] - teY);
    if (d > far) {
      far = d;
      leading = i;
    }
  }
  const chord = far;
  const angle = Math.atan2(teY - y[leading], teX - x[leading]);
  const c = Math.cos(-angle);
  const s = Math.sin(-angle);
  const outX: number[] = [];
  const outY: number[] = [];
  for (let i = 0; i < n; i++) {
    const dx = (x[i] - x[leading]) / chord;
    const dy = (y[i] - y[leading]) / chord;
    outX.push(dx * c - dy * s);
    outY.push(dx * s + dy * c);
  }
  return { x: outX, y: outY, chord, twistDeg: (angle * 180) / Math.PI };
}
