import { describe, expect, it } from 'vitest';
import { analyzeCase, CaseError } from './analyze';
import { binaryTableFault, keptPressureTable, parsePressureTable, type PressureTableParse } from './pressure-table';

function rows(result: PressureTableParse) {
  if (!result.ok) throw new Error(`unexpected problems: ${JSON.stringify(result.problems)}`);
  return result.rows;
}

function problems(result: PressureTableParse) {
  if (result.ok) throw new Error('expected problems');
  return result.problems;
}

describe('pressure table reader', () => {
  it('reads space, tab, comma and semicolon separated rows with comments and blank lines', () => {
    const text = ['# Larkspur wing, station 3', '', '1.0 0.001 0.12', '0.5\t0.06\t-0.40  # mid-chord', '0.0, 0.0, 1.0', '0.5;-0.05;-0.2', '1.0 , -0.001 , 0.1,'].join('\n');
    const read = rows(parsePressureTable(text));
    expect(read.map((r) => r.line)).toEqual([3, 4, 5, 6, 7]);
    expect(read[1]).toEqual({ line: 4, x: 0.5, y: 0.06, cp: -0.4 });
    expect(read[4].cp).toBe(0.1);
  });

  it('reads two-column x cp tables and a header in any order, with a −Cp column', () => {
    expect(rows(parsePressureTable('1 0.1\n0 1\n1 0.1'))[1]).toEqual({ line: 2, x: 0, y: null, cp: 1 });
    const swapped = rows(parsePressureTable('Cp  x/c  z/c\n0.2 1.0 0.0\n1.0 0.0 0.0'));
    expect(swapped[0]).toEqual({ line: 2, x: 1, y: 0, cp: 0.2 });
    expect(rows(parsePressureTable('x -Cp\n0.3 0.45'))[0].cp).toBe(-0.45);
    // Extra columns are ignored when the header names x and cp.
    expect(rows(parsePressureTable('tap x y cp\n17 0.25 0.04 -0.6'))[0]).toEqual({ line: 2, x: 0.25, y: 0.04, cp: -0.6 });
  });

  it('reads quoted spreadsheet fields', () => {
    expect(rows(parsePressureTable('"x","y","Cp"\n"0.5","0.06","-0.4"'))[0]).toEqual({ line: 2, x: 0.5, y: 0.06, cp: -0.4 });
  });

  it('accepts a byte-order mark, Windows line ends and Fortran-style exponents', () => {
    expect(rows(parsePressureTable('\uFEFFx y cp\r\n1.0D+00 0 -2.5E-01\r\n'))[0]).toEqual({ line: 2, x: 1, y: 0, cp: -0.25 });
  });

  it('names the line of a value that is not a number', () => {
    const text = 'x y cp\n1 0 0.1\n0.5 0.1 -0.3\n0 0 1\n0.5 -0.1 -0.1\n1 0 abc';
    expect(problems(parsePressureTable(text))).toEqual([{ line: 6, message: '"abc" is not a number (cp)' }]);
  });

  it('names lines with the wrong number of values, and reports several problems', () => {
    const found = problems(parsePressureTable('1 0 0.1\n0.5 0.1\n0 0 1\n0.5 0.1 0.2 0.3'));
    expect(found.map((p) => p.line)).toEqual([2, 4]);
    expect(found[0].message).toContain('expected 3');
  });

  it('reads decimal commas when semicolons or tabs separate the fields (European spreadsheet exports)', () => {
    const semicolons = 'x/c;y/c;Cp\n1,0;0,001;0,12\n0,5;0,06;-0,40\n0,0;0,0;1,0\n0,5;-0,05;-0,2;\n1,0;-0,001;0,1';
    expect(rows(parsePressureTable(semicolons))).toEqual([
      { line: 2, x: 1, y: 0.001, cp: 0.12 },
      { line: 3, x: 0.5, y: 0.06, cp: -0.4 },
      { line: 4, x: 0, y: 0, cp: 1 },
      { line: 5, x: 0.5, y: -0.05, cp: -0.2 },
      { line: 6, x: 1, y: -0.001, cp: 0.1 },
    ]);
    expect(rows(parsePressureTable('0,25\t-0,41\n0,5\t-0,2\n1\t0,1'))).toEqual([
      { line: 1, x: 0.25, y: null, cp: -0.41 },
      { line: 2, x: 0.5, y: null, cp: -0.2 },
      { line: 3, x: 1, y: null, cp: 0.1 },
    ]);
    // A comma between decimal-point numbers still separates them.
    expect(rows(parsePressureTable('0.5,-0.4\n1.0,0.1'))[0]).toEqual({ line: 1, x: 0.5, y: null, cp: -0.4 });
  });

  it('lists at most 20 problems and counts the rest', () => {
    const text = ['x y cp', ...Array.from({ length: 45 }, (_, i) => `${i / 45} 0 bad${i}`)].join('\n');
    const found = problems(parsePressureTable(text));
    expect(found).toHaveLength(21);
    expect(found[19]).toEqual({ line: 21, message: '"bad19" is not a number (cp)' });
    expect(found[20]).toEqual({ line: 0, message: 'and 25 more lines with problems, not listed' });
  });

  it('explains decimal commas, empty tables and headers without data', () => {
    // Decimal commas mixed with decimal points cannot be read either way.
    expect(problems(parsePressureTable('0.5;0,1;-0,3'))[0].message).toContain('decimal point');
    expect(problems(parsePressureTable('# nothing here\n\n'))).toEqual([{ line: 0, message: 'the table has no data rows' }]);
    expect(problems(parsePressureTable('x y cp\n'))[0]).toEqual({ line: 1, message: 'the table has a header but no data rows' });
    expect(problems(parsePressureTable('alpha beta gamma delta\n1 1 0 0.1'))[0]).toMatchObject({ line: 1 });
  });

  it('refuses more rows than the limit, naming the first line beyond it', () => {
    const text = Array.from({ length: 12 }, (_, i) => `${i} 0.1`).join('\n');
    expect(problems(parsePressureTable(text, { maxRows: 10 }))).toEqual([{ line: 11, message: 'more than 10 data rows (limit)' }]);
  });
});

describe('pressure table reader: plain lines read without regular expressions', () => {
  // The reader's grammar, as its regular expressions state it (pressure-table.ts before the plain-line
  // path): fields split at runs of white space or at a comma, semicolon or tab; a number is
  // [+-]?(\d+\.?\d*|\.\d+)([eEdD][+-]?\d+)? read by Number with d as e.
  const SEPARATOR = /\s*[,;\t]\s*|\s+/;
  const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eEdD][+-]?\d+)?$/;
  const byGrammar = (field: string) => (NUMBER.test(field) ? Number(field.replace(/[dD]/, 'e')) : NaN);

  it('reads every line of digits, points, signs, e, spaces and tabs as the grammar does', () => {
    let seed = 42;
    const next = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
    const pieces = ['0', '1', '7', '.', '-', '+', 'e', 'E', '12', '0.5', '-0.25', '1e-3', '2E+5', '.5', '5.', '3e', 'e5', '1..2', '--1', '+.', '1e+', '.e1'];
    const separators = [' ', '  ', '\t', ' \t ', '\t\t'];
    const lines: string[] = [];
    for (let i = 0; i < 4000; i++) {
      const count = next() < 0.8 ? 3 : next() < 0.5 ? 2 : 4;
      const fields = Array.from({ length: count }, () => Array.from({ length: next() < 0.8 ? 1 : 2 }, () => pieces[Math.floor(next() * pieces.length)]).join(''));
      lines.push(fields.map((f, k) => (k === 0 ? f : separators[Math.floor(next() * separators.length)] + f)).join(''));
    }
    const parsed = parsePressureTable(['x y cp', ...lines].join('\n'), { maxProblems: 10_000 });
    const expectedRows: { line: number; x: number; y: number; cp: number }[] = [];
    const expectedProblemLines: number[] = [];
    lines.forEach((content, i) => {
      const values = content.split(SEPARATOR).map(byGrammar);
      if (values.length === 3 && values.every(Number.isFinite)) expectedRows.push({ line: i + 2, x: values[0]!, y: values[1]!, cp: values[2]! });
      else expectedProblemLines.push(i + 2);
    });
    expect(expectedRows.length).toBeGreaterThan(100);
    expect(parsed.ok).toBe(false);
    if (parsed.ok) return;
    expect(parsed.problems.map((p) => p.line)).toEqual(expectedProblemLines);
    const good = parsePressureTable(['x y cp', ...expectedRows.map((r) => lines[r.line - 2])].join('\n'));
    expect(rows(good).map((r) => [r.x, r.y, r.cp])).toEqual(expectedRows.map((r) => [r.x, r.y, r.cp]));
  });
});

describe('keptPressureTable: the engine reads a table it has just read without parsing it again', () => {
  const table = (label: string) => [`# ${label}`, 'x y cp', '1 0.001 0.1', '0.5 0.06 -0.4', '0 0 1', '0.5 -0.05 -0.2', '1 -0.001 0.1'].join('\n');

  it('gives what parsePressureTable gives, and the same parse again for the same text and options', () => {
    const text = table('kept A');
    const first = keptPressureTable(text);
    expect(first).toEqual(parsePressureTable(text));
    // A text equal to the character, built anew (as each worker task brings its own copy), finds it.
    expect(keptPressureTable(table('kept A'))).toBe(first);
    // Other options are another parse: a body radius column is not in this table.
    expect(keptPressureTable(text, { radius: true })).toEqual(parsePressureTable(text, { radius: true }));
    expect(keptPressureTable(text, { radius: true }).ok).toBe(false);
    expect(keptPressureTable(text)).toBe(first);
    const bad = 'x cp\n1 0\n0.5 zero\n0 1';
    expect(keptPressureTable(bad)).toEqual(parsePressureTable(bad));
  });

  it('is frozen, so no reader can change what the next one is given', () => {
    const parse = keptPressureTable(table('kept B'));
    if (!parse.ok) throw new Error('expected rows');
    expect(() => {
      (parse.rows[0] as { x: number }).x = 2;
    }).toThrow(TypeError);
    expect(() => (parse.rows as unknown[]).push({})).toThrow(TypeError);
    expect(parse.rows[0]!.x).toBe(1);
  });

  it('keeps only the last few texts', () => {
    const first = keptPressureTable(table('kept C 0'));
    for (let i = 1; i <= 8; i++) keptPressureTable(table(`kept C ${i}`));
    const again = keptPressureTable(table('kept C 0'));
    expect(again).not.toBe(first);
    expect(again).toEqual(first);
  });
});

describe('pressure table errors through the engine', () => {
  const field = (pressureTable: string, mach = 0) => {
    try {
      analyzeCase({ flow: { reynolds: 1e6, mach }, pressureTable });
    } catch (error) {
      if (error instanceof CaseError) return error;
    }
    throw new Error('expected a CaseError');
  };

  it('reports the table line in the field', () => {
    const error = field('x y cp\n1 0 0.1\n0.5 0.1 -0.3\n0 0 1\n0.5 -0.1 x\n1 0 0.1');
    expect(error.field).toBe('pressureTable line 5');
    expect(error.message).toBe('pressureTable line 5: "x" is not a number (cp)');
  });

  it('refuses Cp above the stagnation value, naming its line', () => {
    const error = field('x y cp\n1 0 0.1\n0.5 0.05 -0.3\n0.1 0.03 0.2\n0 0 1.2\n0.1 -0.03 0.3\n0.5 -0.05 -0.1\n1 0 0.1');
    expect(error.field).toBe('pressureTable line 5');
    expect(error.detail).toContain('above the stagnation value');
  });

  it('refuses a repeated point and a loop without its leading edge inside', () => {
    expect(field('x y cp\n1 0 0.1\n0.5 0.05 -0.3\n0.5 0.05 -0.3\n0 0 1\n0.5 -0.05 -0.1\n0.8 -0.03 0\n1 0 0.1').field).toBe('pressureTable line 4');
    expect(field('x y cp\n0 0 1\n0.2 0.04 -0.3\n0.4 0.05 -0.3\n0.6 0.04 -0.2\n0.8 0.02 0\n0.9 0.01 0.05\n1 0 0.1').detail).toContain('end of the loop');
  });
});

describe('binaryTableFault', () => {
  it('lets text tables through: UTF-8, Latin-1, tabs, Windows line ends and form feeds', () => {
    expect(binaryTableFault(new TextEncoder().encode('x/c\ty/c\tCp\r\n1,0;0,0;0,12\r\n\f0.5 0.06 -0.40 # Zürich taps\n'))).toBeNull();
    // "réglage" in Latin-1: é is the single byte 0xe9.
    expect(binaryTableFault(Uint8Array.from([0x72, 0xe9, 0x67, 0x6c, 0x61, 0x67, 0x65, 0x0a, 0x30, 0x20, 0x31]))).toBeNull();
  });

  it('refuses a workbook or image saved as is, naming what gave it away', () => {
    // The first bytes of a PNG (its signature, PNG specification ISO/IEC 15948, 5.2) and of a zip
    // archive such as an .xlsx workbook ("PK\x03\x04", PKWARE APPNOTE.TXT, 4.3.7); both from memory.
    expect(binaryTableFault(Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))).toBe('holds binary data (control byte 0x1a at byte 7)');
    expect(binaryTableFault(Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00]))).toBe('holds binary data (control byte 0x03 at byte 3)');
    expect(binaryTableFault(Uint8Array.from([0x31, 0x20, 0x00, 0x32]))).toBe('holds binary data (NUL bytes)');
  });
});
