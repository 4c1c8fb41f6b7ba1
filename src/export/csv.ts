/**
 * CSV helpers shared by the fixture schedule and the order list: writing
 * (quoting through papaparse, numbers with the chosen decimal separator,
 * formula-injection cells neutralised) and the reverse for reading.
 *
 * Formula injection: a spreadsheet runs a cell that starts with `=`, `+`,
 * `-` or `@` (and some also after a tab or carriage return) as a formula.
 * Text cells that start so get a leading apostrophe, which spreadsheets show
 * as text. To keep the round trip lossless, text that already starts with
 * apostrophes followed by such a character gets one more, and reading takes
 * exactly one off again. Number cells are written as plain numbers and never
 * prefixed: a bare number is not a formula.
 */
import Papa from 'papaparse';
import { CalcInputError } from '../calc/errors.ts';
import type { CsvFormat } from './types.ts';

const trigger = /^'*[=+\-@\t\r]/;
const escaped = /^'+[=+\-@\t\r]/;

/**
 * Neutralises a text cell for spreadsheets (see the file header).
 *
 * @example neutraliseCell('=HYPERLINK("x")') //=> "'=HYPERLINK(\"x\")"
 */
export function neutraliseCell(text: string): string {
  return trigger.test(text) ? `'${text}` : text;
}

/**
 * Undoes {@link neutraliseCell}: takes one apostrophe off a cell that starts
 * with apostrophes followed by `=`, `+`, `-`, `@`, tab or carriage return.
 *
 * @example restoreCell("'=1+1") //=> '=1+1'
 */
export function restoreCell(text: string): string {
  return escaped.test(text) ? text.slice(1) : text;
}

/**
 * The delimiter and decimal separator to use, with defaults; throws a
 * `CalcInputError` naming `delimiter` or `decimalSeparator` for others.
 *
 * @example csvFormat({ decimalSeparator: ',' }) //=> { delimiter: ',', decimalSeparator: ',' }
 */
export function csvFormat(format: CsvFormat = {}): Required<CsvFormat> {
  const delimiter = format.delimiter ?? ',';
  const decimalSeparator = format.decimalSeparator ?? '.';
  if (![',', ';', '\t'].includes(delimiter)) throw new CalcInputError('delimiter', `must be ",", ";" or a tab (got ${JSON.stringify(delimiter)})`);
  if (!['.', ','].includes(decimalSeparator)) {
    throw new CalcInputError('decimalSeparator', `must be "." or "," (got ${JSON.stringify(decimalSeparator)})`);
  }
  return { delimiter, decimalSeparator };
}

/**
 * A number for a CSV cell: the shortest text that reads back as the same
 * number (no exponent), with the chosen decimal separator; `digits` rounds
 * it first (for computed columns meant for reading).
 *
 * @example csvNumber(1.5, ',') //=> '1,5'
 */
export function csvNumber(value: number, decimalSeparator: '.' | ',', digits?: number): string {
  if (!Number.isFinite(value)) throw new CalcInputError('value', `must be a finite number (got ${String(value)})`);
  let text: string;
  if (digits !== undefined) {
    const rounded = Number(value.toFixed(digits));
    text = String(rounded === 0 ? 0 : rounded);
  } else {
    text = String(value === 0 ? 0 : value);
  }
  if (/e/i.test(text)) text = value.toLocaleString('en-US', { useGrouping: false, maximumFractionDigits: 20 });
  return decimalSeparator === ',' ? text.replace('.', ',') : text;
}

/** A CSV cell: text (neutralised on writing), a number, or empty. */
export type CsvCell = string | number | null | undefined;

/**
 * Writes rows as CSV (RFC 4180 quoting via papaparse, CRLF line ends): text
 * cells are neutralised, numbers use the decimal separator, null and
 * undefined are empty cells.
 *
 * @example toCsv([['name', 'watts'], ['=cmd', 1.5]], { decimalSeparator: ',', delimiter: ';' }) //=> "name;watts\r\n'=cmd;1,5"
 */
export function toCsv(rows: readonly (readonly CsvCell[])[], format: CsvFormat = {}): string {
  const { delimiter, decimalSeparator } = csvFormat(format);
  const text = rows.map((row) =>
    row.map((cell) => (cell === null || cell === undefined ? '' : typeof cell === 'number' ? csvNumber(cell, decimalSeparator) : neutraliseCell(cell))),
  );
  return Papa.unparse(text, { delimiter, newline: '\r\n', quotes: false, escapeFormulae: false });
}

/** A problem found while reading CSV text, at a spreadsheet row (the header is row 1). */
export interface CsvProblem {
  rowNumber: number;
  message: string;
}

/**
 * Reads CSV text into rows of cells (not yet restored), keeping blank lines
 * so that each row's index + 1 is its spreadsheet row number. A leading
 * byte-order mark is dropped. The delimiter is detected unless given.
 *
 * @example readCsv('a,b\r\n1,2').rows //=> [['a', 'b'], ['1', '2']]
 */
export function readCsv(text: string, delimiter?: CsvFormat['delimiter']): { rows: string[][]; delimiter: string; problems: CsvProblem[] } {
  const input = text.startsWith('\uFEFF') ? text.slice(1) : text;
  const parsed = Papa.parse<string[]>(input, {
    header: false,
    skipEmptyLines: false,
    dynamicTyping: false,
    delimiter: delimiter ?? '',
    delimitersToGuess: [',', ';', '\t'],
  });
  const problems: CsvProblem[] = parsed.errors
    .filter((e) => e.code !== 'UndetectableDelimiter')
    .map((e) => ({ rowNumber: (e.row ?? 0) + 1, message: `${e.message.replace(/\.$/, '')} (${e.code})` }));
  return { rows: parsed.data, delimiter: parsed.meta.delimiter, problems };
}

/**
 * UTF-8 bytes with a byte-order mark, so spreadsheet programs open the file
 * as UTF-8 (common practice, no published source).
 *
 * @example utf8WithBom('a')[0] //=> 0xef
 */
export function utf8WithBom(text: string): Uint8Array {
  return new TextEncoder().encode(`\uFEFF${text}`);
}

/**
 * True when `text` takes more than `limit` bytes as UTF-8, counted without
 * encoding it (so an oversized text is refused before anything reads it).
 *
 * @example utf8BytesOver('é', 1) //=> true
 */
export function utf8BytesOver(text: string, limit: number): boolean {
  if (text.length > limit) return true;
  if (text.length * 3 <= limit) return false;
  let bytes = 0;
  for (let index = 0; index < text.length; index++) {
    const code = text.charCodeAt(index);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && index + 1 < text.length && (text.charCodeAt(index + 1) & 0xfc00) === 0xdc00) {
      bytes += 4;
      index++;
    } else bytes += 3;
    if (bytes > limit) return true;
  }
  return false;
}
