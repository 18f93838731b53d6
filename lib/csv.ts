// CSV files for spreadsheets (RFC 4180, written by papaparse), safe to open: a text cell that starts like a
// formula gets a leading apostrophe so the spreadsheet shows it as text. OWASP, "CSV Injection": escape a cell
// that begins with = + - @ tab or carriage return. papaparse's own `escapeFormulae: true` pattern
// (/^[=+\-@\t\r].*$/) has no `s` flag, so a cell whose first line ends in a newline slips past it; this
// pattern looks at the first character only, whatever follows. Numbers are written as numbers, never escaped.
import Papa from 'papaparse';

export const FORMULA_START = /^[=+\-@\t\r]/;

export type CsvCell = string | number | boolean | null | undefined;

export function toCsv(fields: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return Papa.unparse(
    { fields: [...fields], data: rows.map((row) => row.map((cell) => cell ?? '')) },
    { newline: '\r\n', escapeFormulae: FORMULA_START },
  );
}
