import Papa from 'papaparse';

/**
 * CSV that a spreadsheet opens as data, never as formulas. After the OWASP guidance on CSV injection
 * (OWASP Foundation, "CSV Injection", owasp.org/www-community/attacks/CSV_Injection): a text cell
 * starting with `=`, `+`, `-`, `@`, tab or carriage return is prefixed with a single quote and quoted.
 * Numbers are left as they are (a negative number is data).
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export type CsvValue = string | number | null;

export function toCsv(fields: string[], rows: CsvValue[][]): string {
  return Papa.unparse({ fields, data: rows }, { newline: '\n', escapeFormulae: FORMULA_START });
}

/**
 * A `# …` comment line above the table: line breaks in what it quotes (a title) would start a new row
 * of the file, so they become spaces.
 */
export function csvCommentLine(text: string): string {
  return `# ${text.replace(/[\r\n\t\u2028\u2029]+/g, ' ')}`;
}
