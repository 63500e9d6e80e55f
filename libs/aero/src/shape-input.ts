/**
 * A shape's input as a person gives it, read and checked without the panel methods (no solver, no
 * ml-matrix), so the web app's body cell can read a pasted meridian on its own. The engine reads it
 * the same way (section-case.ts). Bad input throws ShapeInputError naming the field (and line) at fault.
 */

export class ShapeInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
    readonly line?: number,
  ) {
    super(message);
    this.name = 'ShapeInputError';
  }
}

/** Read a meridian `x r` from the nose to the tail; the same reader rules as section coordinates. */
export function readBodyMeridian(text: string): { x: number[]; r: number[] } {
  const x: number[] = [];
  const r: number[] = [];
  const lines = text.split(/\r\n|\n|\r/);
  let title = false;
  for (let i = 0; i < lines.length; i++) {
    const content = lines[i].replace(/#.*$/, '').trim();
    if (content === '') continue;
    const fields = content.replace(/[,;]$/, '').split(/\s*[,;\t]\s*|\s+/);
    const values = fields.map((f) => (/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(f) ? Number(f) : NaN));
    if (!values.every(Number.isFinite)) {
      if (x.length === 0 && !title) {
        title = true;
        continue;
      }
      throw new ShapeInputError('coordinates', `line ${i + 1}: "${fields.find((_, k) => !Number.isFinite(values[k]))!.slice(0, 40)}" is not a number`, i + 1);
    }
    if (fields.length !== 2) throw new ShapeInputError('coordinates', `line ${i + 1}: expected two numbers, x and r, found ${fields.length}`, i + 1);
    if (values[1] < 0) throw new ShapeInputError('coordinates', `line ${i + 1}: body radius must not be negative`, i + 1);
    if (x.length > 0 && !(values[0] > x[x.length - 1])) throw new ShapeInputError('coordinates', `line ${i + 1}: x must increase from the nose to the tail (${values[0]} after ${x[x.length - 1]})`, i + 1);
    x.push(values[0]);
    r.push(values[1]);
  }
  if (x.length < 5) throw new ShapeInputError('coordinates', `needs at least 5 points from the nose to the tail, found ${x.length}`);
  if (r[0] !== 0 || r[r.length - 1] !== 0) throw new ShapeInputError('coordinates', 'the meridian must start and end on the axis (r = 0 at the nose and the tail)');
  return { x, r };
}
