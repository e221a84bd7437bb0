// CSV as RFC 4180 (Shafranovich, "Common Format and MIME Type for
// Comma-Separated Values (CSV) Files", 2005): CRLF after every record, fields
// quoted only when they must be, quotes doubled inside quotes. Numbers are
// written without locale ('.' decimals) so any reader parses them back.

export type CsvCell = number | string | null;

export interface CsvOptions {
  /** Significant digits of non-integer numbers (1–17); default 8. */
  significantDigits?: number;
}

const CRLF = '\r\n';
const MUST_QUOTE = /[",\r\n]/;
// Integers below this print exactly; toPrecision would round them.
const EXACT_INTEGER_LIMIT = 1e15;

export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[], options: CsvOptions = {}): string {
  const digits = options.significantDigits ?? 8;
  if (!(Number.isInteger(digits) && digits >= 1 && digits <= 17)) {
    throw new RangeError(`significantDigits must be an integer in 1..17 (got ${digits})`);
  }
  if (header.length === 0) throw new RangeError('a CSV needs at least one column');
  const lines = [formatRecord(header, digits)];
  rows.forEach((row, i) => {
    if (row.length !== header.length) {
      throw new RangeError(`row ${i} has ${row.length} fields, the header ${header.length}`);
    }
    lines.push(formatRecord(row, digits));
  });
  return lines.join(CRLF) + CRLF;
}

/**
 * Number as text: integers exactly, others to `significantDigits` with the
 * shortest form that reads back to the rounded value; NaN and ±Infinity as
 * "NaN", "Infinity", "-Infinity" (what Number() reads back).
 */
export function formatCsvNumber(value: number, significantDigits = 8): string {
  if (!Number.isFinite(value)) return String(value);
  if (Object.is(value, -0)) return '0';
  if (Number.isInteger(value) && Math.abs(value) < EXACT_INTEGER_LIMIT) return String(value);
  return String(Number(value.toPrecision(significantDigits)));
}

function formatRecord(cells: readonly CsvCell[], digits: number): string {
  // A lone empty field would make an empty line, which reads as no record.
  if (cells.length === 1 && (cells[0] === null || cells[0] === '')) return '""';
  return cells.map((cell) => formatField(cell, digits)).join(',');
}

function formatField(cell: CsvCell, digits: number): string {
  if (cell === null) return '';
  const text = typeof cell === 'number' ? formatCsvNumber(cell, digits) : cell;
  return MUST_QUOTE.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/**
 * Records of an RFC 4180 text, every field a string. Lenient only about line
 * ends (CRLF, LF or CR) and a missing final line end; a stray quote in an
 * unquoted field, text after a closing quote or an unclosed quote throws.
 */
export function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let i = 0;
  while (i < text.length) {
    const { field, next } = text[i] === '"' ? readQuoted(text, i) : readPlain(text, i);
    record.push(field);
    i = next;
    if (text[i] === ',') {
      i++;
      if (i === text.length) record.push('');
      continue;
    }
    records.push(record);
    record = [];
    i = skipLineEnd(text, i);
  }
  // A text ending in a separator leaves its last record open.
  if (record.length > 0) records.push(record);
  return records;
}

function readPlain(text: string, start: number): { field: string; next: number } {
  let i = start;
  while (i < text.length && text[i] !== ',' && text[i] !== '\r' && text[i] !== '\n') {
    if (text[i] === '"') throw new SyntaxError(`CSV: quote inside an unquoted field at offset ${i}`);
    i++;
  }
  return { field: text.slice(start, i), next: i };
}

function readQuoted(text: string, start: number): { field: string; next: number } {
  let field = '';
  let i = start + 1;
  for (;;) {
    const close = text.indexOf('"', i);
    if (close < 0) throw new SyntaxError(`CSV: quoted field from offset ${start} is not closed`);
    field += text.slice(i, close);
    if (text[close + 1] === '"') {
      field += '"';
      i = close + 2;
      continue;
    }
    const after = close + 1;
    if (after < text.length && !',\r\n'.includes(text[after])) {
      throw new SyntaxError(`CSV: text after a closing quote at offset ${after}`);
    }
    return { field, next: after };
  }
}

function skipLineEnd(text: string, i: number): number {
  if (text[i] === '\r') return text[i + 1] === '\n' ? i + 2 : i + 1;
  if (text[i] === '\n') return i + 1;
  return i;
}
