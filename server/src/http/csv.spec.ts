import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { csvCommentLine, toCsv } from './csv';

describe('CSV without formulas (OWASP "CSV Injection")', () => {
  it('prefixes text cells that a spreadsheet would run with a quote, and keeps numbers', () => {
    const csv = toCsv(['surface', 'x'], [
      ['=HYPERLINK("http://evil.example","x")', 1],
      ['+1+1', -0.25],
      ['-2+3', 0],
      ['@SUM(A1)', 2],
      ['\tlead', 3],
      ['\r=1', 4],
      ['=A1\n=B1', 5],
      ['upper', -1e-3],
    ]);
    const rows = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data.slice(1);
    for (const [text] of rows.slice(0, 7)) expect(text!.startsWith("'")).toBe(true);
    expect(rows[7]).toEqual(['upper', '-0.001']);
    expect(rows[1]![1]).toBe('-0.25');
  });

  it('keeps a title with line breaks on its comment line', () => {
    expect(csvCommentLine('Wing\n=HYPERLINK("x")\r\nend')).toBe('# Wing =HYPERLINK("x") end');
  });
});
