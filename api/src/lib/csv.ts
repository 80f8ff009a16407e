// CSV as RFC 4180 writes it: fields separated by commas, records by CRLF; a field holding a
// comma, double quote, CR or LF is enclosed in double quotes with inner quotes doubled.

/** One cell: text, a number, or empty. */
export type CsvCell = string | number | null | undefined;

// Spreadsheets run a cell that starts with one of these as a formula (OWASP "CSV injection").
const FORMULA_START = /^[=+\-@\t\r]/;

/** Returns `text` made safe to open in a spreadsheet: a leading formula character gets a `'` in front. */
export function guardFormula(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** Returns one field, quoted when RFC 4180 requires it. */
export function csvField(cell: CsvCell): string {
  if (cell === null || cell === undefined) return '';
  const text = typeof cell === 'number' ? (Number.isFinite(cell) ? String(cell) : '') : cell;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** Returns the rows as CSV text (CRLF after every record, the last one included). */
export function toCsv(rows: CsvCell[][]): string {
  return rows.map((row) => row.map(csvField).join(',') + '\r\n').join('');
}
