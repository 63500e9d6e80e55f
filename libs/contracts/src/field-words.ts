import { CELL_KINDS, type CellKind, FIELD_LABELS } from './cell-kinds';

/**
 * Field paths said in the words of the screen. The API, the engine and the schemas name a field by its
 * path (`turbulenceIntensity`, `flow.mach`, `trips.upper`, `pressureTable line 7`) so scripts can act
 * on it; a person reads the label the cell shows (`Turbulence level`, `Mach number`, `Trip on upper at
 * x/c`, `Pressure table, line 7`). Problem details keep the path in `field`; what is shown to a person
 * goes through `readableMessage`.
 */

/** Names the engine's case and the flow cell share, and a few the engine alone uses. */
const ENGINE_LABELS: Readonly<Record<string, string>> = {
  reynolds: 'Reynolds number',
  mach: 'Mach number',
  nCrit: 'N_crit',
  turbulenceIntensity: 'Turbulence level',
  sweepDeg: 'Sweep (°)',
  pressureTable: 'Pressure table',
  text: 'Pressure table',
  criteria: 'Transition criteria',
  surfaces: 'Surfaces',
};

function labelIn(kind: CellKind | null, name: string): string | null {
  if (kind && FIELD_LABELS[kind]?.[name]) return FIELD_LABELS[kind][name]!;
  if (ENGINE_LABELS[name]) return ENGINE_LABELS[name]!;
  for (const other of CELL_KINDS) {
    const label = FIELD_LABELS[other]?.[name];
    if (label) return label;
  }
  return null;
}

/**
 * The label of a field path, or null when the path names nothing known. `kind` picks the cell's own
 * labels first (a flat plate's "reynolds" is its own Reynolds number).
 */
export function fieldPathLabel(path: string, kind: CellKind | null = null): string | null {
  const table = /^(?:pressureTable|text) line (\d+)$/.exec(path);
  if (table) return `Pressure table, line ${table[1]}`;
  const parts = path.replace(/\[(\d+)\]/g, '.$1').split('.').filter((p) => p !== '' && p !== 'inputs');
  if (parts[0] === 'flow' && parts.length > 1) parts.shift();
  if (parts[0] === 'trips' && parts[1]) return `Trip on ${parts[1]} at x/c`;
  if (parts[0] === 'second' && parts[1]) {
    const inner = labelIn('sweep', parts[1]);
    return inner ? `Second parameter: ${inner.toLowerCase()}` : null;
  }
  if (parts.length === 0) return null;
  return labelIn(kind, parts[parts.length - 1]!) ?? (parts.length > 1 ? labelIn(kind, parts[0]!) : null);
}

/** An identifier that is no English word: camelCase, snake_case or a dotted path. */
const CODE_NAME = /\b[a-z][a-zA-Z0-9]*(?:(?:[A-Z]|_)[a-zA-Z0-9]*|\.[a-z][a-zA-Z0-9]*(?:\[\d+\])?)+\b/g;
/**
 * A message that starts with a field's name as its subject: "mach 0.5: …", "reynolds must be …",
 * "nCrit is …" (not "at most …", whose first word only looks like a field).
 */
const LEADING_NAME = /^([a-z][a-zA-Z0-9_]*(?:\.[a-zA-Z0-9_]+)*)(?=:| (?:must|is|are|needs?|should|has)\b| [-−+]?\d)/;

/**
 * A message from the engine, a schema or the API, with the field names in it said as their labels:
 * "turbulenceIntensity 0.0002 is outside …" reads "Turbulence level 0.0002 is outside …", "mach 0.5: …"
 * reads "Mach number 0.5: …", "(trips.upper)" reads "(Trip on upper at x/c)". Words that are only
 * English stay as they are. `startsSentence` false keeps the first letter's case, for a message that
 * follows a title ("Internal error: request id 42").
 */
export function readableMessage(message: string, kind: CellKind | null = null, startsSentence = true): string {
  let text = message.replace(/\b(?:pressureTable|text) line (\d+)\b/g, 'Pressure table, line $1');
  const leading = LEADING_NAME.exec(text);
  if (leading) {
    const label = fieldPathLabel(leading[1]!, kind);
    if (label) text = label + text.slice(leading[1]!.length);
  }
  text = text.replace(CODE_NAME, (name) => fieldPathLabel(name, kind) ?? name);
  // A sentence starts with a capital; a symbol (x/c, c_d) keeps its case.
  return startsSentence && /^[a-z]+[ ,;:]/.test(text) ? text.charAt(0).toUpperCase() + text.slice(1) : text;
}
