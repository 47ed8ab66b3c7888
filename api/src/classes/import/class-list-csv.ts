import { createReadStream } from 'node:fs';
import { CsvError, parse as parseStream } from 'csv-parse';
import { parse } from 'csv-parse/sync';
import {
  CLASS_IMPORT_MAX_BYTES,
  CLASS_IMPORT_MAX_ROWS,
  CLASS_LIST_COLUMNS,
  type ClassListColumnKey,
} from '@stavemark/shared';

/** A problem with the file as a whole: nothing in it is imported. */
export class CsvFileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'CsvFileError';
  }
}

export interface CsvRecord {
  /** Line where the record starts (header = line 1; a quoted line break makes a record span lines). */
  line: number;
  cells: Partial<Record<ClassListColumnKey, string>>;
  /** When the record has more or fewer fields than the header. */
  shapeError: string | null;
}

export interface ParsedClassList {
  delimiter: ',' | ';';
  columns: ClassListColumnKey[];
  records: CsvRecord[];
}

const SAVE_AS_HINT =
  'In your spreadsheet choose Save As and the format “CSV UTF-8 (comma delimited)”, then upload that file. Nothing was imported.';
const BYTE = (b: number) => `0x${b.toString(16).toUpperCase().padStart(2, '0')}`;
const mb = (n: number) => `${(n / 1024 / 1024).toFixed(n % (1024 * 1024) === 0 ? 0 : 1)} MB`;

/** Offset of the first byte sequence that is not valid UTF-8 (RFC 3629), or -1. */
export function firstInvalidUtf8(buf: Uint8Array): number {
  let i = 0;
  while (i < buf.length) {
    const b = buf[i]!;
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    if (b >= 0xc2 && b <= 0xdf) [need, min] = [1, 0x80];
    else if (b >= 0xe0 && b <= 0xef) [need, min] = [2, 0x800];
    else if (b >= 0xf0 && b <= 0xf4) [need, min] = [3, 0x10000];
    else return i;
    if (i + need >= buf.length) return i; // cut off at the end of the file
    let cp = b & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      const c = buf[i + k];
      if (c === undefined || (c & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (c & 0x3f);
    }
    // Overlong forms, UTF-16 surrogates and code points past U+10FFFF are not UTF-8.
    if (cp < min || (cp >= 0xd800 && cp <= 0xdfff) || cp > 0x10ffff) return i;
    i += need + 1;
  }
  return -1;
}

function lineAt(buf: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (buf[i] === 0x0a) line++;
  return line;
}

/**
 * Checks that the bytes are UTF-8 text and returns them without a byte-order mark. Binary data
 * and other encodings are refused with a message that says what to do (never imported as mojibake).
 */
export function checkCsvBytes(input: Uint8Array): Uint8Array {
  if (input.length === 0)
    throw new CsvFileError('The file is empty. Choose the class list CSV file and try again.');
  if (input.length > CLASS_IMPORT_MAX_BYTES) {
    throw new CsvFileError(
      `The file is ${mb(input.length)}; the limit is ${mb(CLASS_IMPORT_MAX_BYTES)} per import. Split the class list into smaller files.`,
    );
  }
  const buf =
    input[0] === 0xef && input[1] === 0xbb && input[2] === 0xbf ? input.subarray(3) : input;
  for (let i = 0; i < buf.length; i++) {
    const b = buf[i]!;
    // Text has no NUL and no C0 control characters other than tab, line feed and carriage return.
    if (b === 0x00 || (b < 0x20 && b !== 0x09 && b !== 0x0a && b !== 0x0d) || b === 0x7f) {
      throw new CsvFileError(
        `This is not a CSV text file: line ${lineAt(buf, i)} contains the control byte ${BYTE(b)}, which text files do not have (is it a spreadsheet workbook or another binary file?). ${SAVE_AS_HINT}`,
      );
    }
  }
  const bad = firstInvalidUtf8(buf);
  if (bad >= 0) {
    throw new CsvFileError(
      `The file is not UTF-8 text: line ${lineAt(buf, bad)} has the byte ${BYTE(buf[bad]!)}, which is not UTF-8 (the file was probably saved as Latin-1 or Windows-1252, so accented letters would come out garbled). ${SAVE_AS_HINT}`,
    );
  }
  return buf;
}

/** Header text → column key, ignoring case, spaces, hyphens, underscores and dots. */
const normaliseHeader = (h: string): string => h.toLowerCase().replace(/[\s\-_.]/g, '');
const HEADER_INDEX = new Map<string, ClassListColumnKey>();
for (const c of CLASS_LIST_COLUMNS) {
  HEADER_INDEX.set(normaliseHeader(c.header), c.key);
  HEADER_INDEX.set(normaliseHeader(c.key), c.key);
  HEADER_INDEX.set(normaliseHeader(c.header.replace('e-mail', 'email')), c.key);
}
const columnList = CLASS_LIST_COLUMNS.map((c) => `“${c.header}”`).join(', ');

/** The delimiter of the header line: comma unless semicolons outnumber commas outside quotes. */
export function detectDelimiter(buf: Uint8Array): ',' | ';' {
  let commas = 0;
  let semis = 0;
  let quoted = false;
  for (let i = 0; i < buf.length; i++) {
    const b = buf[i];
    if (b === 0x22) quoted = !quoted;
    else if (!quoted && (b === 0x0a || b === 0x0d)) break;
    else if (!quoted && b === 0x2c) commas++;
    else if (!quoted && b === 0x3b) semis++;
  }
  return semis > commas ? ';' : ',';
}

function describeCsvError(err: CsvError): string {
  const line = (err as CsvError & { lines?: number }).lines;
  const where = typeof line === 'number' ? `Line ${line}` : 'The file';
  switch (err.code) {
    case 'CSV_QUOTE_NOT_CLOSED':
      return `${where}: a quoted field is opened with " but never closed, so the rest of the file would be read as one cell. Add the closing quote, then upload again. Nothing was imported.`;
    case 'INVALID_OPENING_QUOTE':
    case 'CSV_INVALID_CLOSING_QUOTE':
      return `${where}: a " appears inside a field that is not quoted properly. Put the whole field in quotes and write a quote inside it as "" (RFC 4180), then upload again. Nothing was imported.`;
    default:
      return `${where}: the file could not be read as CSV (${err.message}). Nothing was imported.`;
  }
}

/**
 * The records of checked bytes with the line each starts on, leaving out blank lines and lines of
 * only delimiters (spreadsheets write ",,,,"). Quoting follows RFC 4180 §2 through csv-parse.
 */
export function readRecords(
  buf: Uint8Array,
  delimiter: ',' | ';',
): { line: number; cells: string[] }[] {
  let raw: { record: string[]; info: { bytes: number } }[];
  try {
    raw = parse(Buffer.from(buf.buffer, buf.byteOffset, buf.byteLength), {
      delimiter,
      relax_column_count: true,
      info: true,
      skip_empty_lines: false,
    }) as unknown as { record: string[]; info: { bytes: number } }[];
  } catch (err) {
    if (err instanceof CsvError) throw new CsvFileError(describeCsvError(err));
    throw err;
  }
  // Start lines from byte offsets: each record starts where the previous one ended.
  const rows: { line: number; cells: string[] }[] = [];
  let offset = 0;
  let line = 1;
  for (const r of raw) {
    const start = line;
    for (let i = offset; i < r.info.bytes && i < buf.length; i++) if (buf[i] === 0x0a) line++;
    offset = r.info.bytes;
    if (r.record.every((c) => c.trim() === '')) continue;
    rows.push({ line: start, cells: r.record });
  }
  return rows;
}

/**
 * Parses a class list (RFC 4180 with what spreadsheets add: CRLF or LF, a UTF-8 BOM, comma or
 * semicolon, blank lines, headers in any case and order). File-level problems throw CsvFileError;
 * problems with one record are left for the row checks, so the preview can list them all.
 */
export function parseClassList(input: Uint8Array): ParsedClassList {
  const buf = checkCsvBytes(input);
  const delimiter = detectDelimiter(buf);
  const rows = readRecords(buf, delimiter);
  return toClassList(rows, rows.length - 1, delimiter);
}

/**
 * The header and the records of a class list; `dataRowCount` counts every non-blank data row,
 * also those past the limit that a streamed read no longer keeps.
 */
function toClassList(
  rows: { line: number; cells: string[] }[],
  dataRowCount: number,
  delimiter: ',' | ';',
): ParsedClassList {
  if (rows.length === 0)
    throw new CsvFileError(
      `The file has no header line. The first line names the columns: ${columnList}.`,
    );

  const header = rows[0]!;
  const columns: ClassListColumnKey[] = [];
  const unknown: string[] = [];
  const seen = new Map<ClassListColumnKey, string>();
  for (const h of header.cells) {
    const key = HEADER_INDEX.get(normaliseHeader(h.trim()));
    if (!key) {
      unknown.push(h.trim() === '' ? '(a column with no name)' : `“${h.trim()}”`);
      continue;
    }
    if (seen.has(key))
      throw new CsvFileError(
        `The columns “${seen.get(key)}” and “${h.trim()}” are the same column. Keep one of them.`,
      );
    seen.set(key, h.trim());
    columns.push(key);
  }
  if (seen.size === 0) {
    throw new CsvFileError(
      `Line 1 should name the columns (${columnList}), but none of its cells is a column name. Download the template to see the layout.`,
    );
  }
  if (unknown.length > 0) {
    throw new CsvFileError(
      `Unknown column${unknown.length > 1 ? 's' : ''} ${unknown.join(', ')}. The class list has these columns: ${columnList}. Remove the others (nothing in them would be imported), then upload again.`,
    );
  }
  const missing = CLASS_LIST_COLUMNS.filter((c) => c.required && !seen.has(c.key)).map(
    (c) => `“${c.header}”`,
  );
  if (missing.length > 0) {
    throw new CsvFileError(
      `The file has no ${missing.join(', ')} column${missing.length > 1 ? 's' : ''}, which ${missing.length > 1 ? 'are' : 'is'} required. Download the template to see the layout.`,
    );
  }

  const dataRows = rows.slice(1);
  if (dataRowCount > CLASS_IMPORT_MAX_ROWS) {
    throw new CsvFileError(
      `The file has ${dataRowCount.toLocaleString('en-GB')} rows of students; the limit is ${CLASS_IMPORT_MAX_ROWS.toLocaleString('en-GB')} per import. Split it into smaller files.`,
    );
  }

  const width = header.cells.length;
  const records: CsvRecord[] = dataRows.map((r) => {
    const cells: Partial<Record<ClassListColumnKey, string>> = {};
    columns.forEach((key, i) => {
      if (i < r.cells.length) cells[key] = r.cells[i];
    });
    const shapeError =
      r.cells.length === width
        ? null
        : r.cells.length > width
          ? `This line has ${r.cells.length} fields but the header has ${width}: is there an extra ${delimiter === ',' ? 'comma' : 'semicolon'}, or a field that needs quotes?`
          : `This line has ${r.cells.length} fields but the header has ${width}: some cells are missing.`;
    return { line: r.line, cells, shapeError };
  });
  return { delimiter, columns, records };
}

/**
 * The text checks of checkCsvBytes, chunk by chunk: a multi-byte character cut by a chunk edge is
 * held back until the next chunk. Also notes where each line feed is, for line numbers.
 */
export class TextChecker {
  private pending: Uint8Array = new Uint8Array(0);
  private offset = 0;
  private lines = 1;
  /** Byte offsets (after the byte-order mark) of every line feed seen. */
  lineFeeds = new Uint32Array(1024);
  lineFeedCount = 0;

  push(chunk: Uint8Array): void {
    const buf = this.pending.length ? Buffer.concat([this.pending, chunk]) : chunk;
    // Hold back the start of a character that continues in the next chunk (at most 3 bytes).
    let cut = buf.length;
    for (let k = 1; k <= 3 && k <= buf.length; k++) {
      const b = buf[buf.length - k]!;
      if ((b & 0xc0) === 0x80) continue; // continuation byte: look further back
      const need = b >= 0xf0 ? 4 : b >= 0xe0 ? 3 : b >= 0xc0 ? 2 : 1;
      if (need > k) cut = buf.length - k;
      break;
    }
    this.check(buf.subarray(0, cut));
    this.pending = Uint8Array.from(buf.subarray(cut));
  }

  end(): void {
    if (this.pending.length) this.check(this.pending, true);
  }

  private check(part: Uint8Array, last = false): void {
    for (let i = 0; i < part.length; i++) {
      const b = part[i]!;
      if (b === 0x0a) this.noteLineFeed(this.offset + i);
      else if (b === 0x00 || (b < 0x20 && b !== 0x09 && b !== 0x0d) || b === 0x7f) {
        throw new CsvFileError(
          `This is not a CSV text file: line ${this.lineOf(i)} contains the control byte ${BYTE(b)}, which text files do not have (is it a spreadsheet workbook or another binary file?). ${SAVE_AS_HINT}`,
        );
      }
    }
    const bad = firstInvalidUtf8(part);
    if (bad >= 0 && (last || bad < part.length)) {
      throw new CsvFileError(
        `The file is not UTF-8 text: line ${this.lineOf(bad)} has the byte ${BYTE(part[bad]!)}, which is not UTF-8 (the file was probably saved as Latin-1 or Windows-1252, so accented letters would come out garbled). ${SAVE_AS_HINT}`,
      );
    }
    this.offset += part.length;
  }

  private noteLineFeed(at: number): void {
    if (this.lineFeedCount === this.lineFeeds.length) {
      const grown = new Uint32Array(this.lineFeeds.length * 2);
      grown.set(this.lineFeeds);
      this.lineFeeds = grown;
    }
    this.lineFeeds[this.lineFeedCount++] = at;
    this.lines++;
  }

  /** The line of byte `i` of the part being checked (its line feeds are already noted). */
  private lineOf(i: number): number {
    return this.lineAt(this.offset + i);
  }

  /** Line number (from 1) of a byte offset: one more than the line feeds before it. */
  lineAt(offset: number): number {
    let lo = 0;
    let hi = this.lineFeedCount;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (this.lineFeeds[mid]! < offset) lo = mid + 1;
      else hi = mid;
    }
    return lo + 1;
  }
}

/**
 * parseClassList for a file on disk, read as streams (design.md §6: uploads are not held in
 * memory): a first pass checks the bytes are UTF-8 text, a second parses them with csv-parse.
 * Two passes keep the order of the checks (not text → refused before any CSV error), and a
 * class list is at most 2 MB, so reading it twice costs milliseconds.
 */
export async function parseClassListFile(
  path: string,
  size: number,
  chunkSize = 64 * 1024,
): Promise<ParsedClassList> {
  if (size === 0)
    throw new CsvFileError('The file is empty. Choose the class list CSV file and try again.');
  if (size > CLASS_IMPORT_MAX_BYTES) {
    throw new CsvFileError(
      `The file is ${mb(size)}; the limit is ${mb(CLASS_IMPORT_MAX_BYTES)} per import. Split the class list into smaller files.`,
    );
  }

  // The first 64 KB (or the whole file) decide the byte-order mark and the delimiter.
  const HEAD = 64 * 1024;
  const checker = new TextChecker();
  let bom = 0;
  let headParts: Buffer[] = [];
  let headLength = 0;
  let head: Buffer | null = null;
  const takeHead = () => {
    head = Buffer.concat(headParts);
    headParts = [];
    if (head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf) {
      bom = 3;
      head = head.subarray(3);
    }
    checker.push(head);
  };
  for await (const chunk of createReadStream(path, { highWaterMark: chunkSize })) {
    if (head !== null) {
      checker.push(chunk as Buffer);
      continue;
    }
    headParts.push(chunk as Buffer);
    headLength += (chunk as Buffer).length;
    if (headLength >= HEAD) takeHead();
  }
  if (head === null) takeHead();
  checker.end();
  if (!head || (head as Buffer).length === 0)
    throw new CsvFileError('The file is empty. Choose the class list CSV file and try again.');
  const delimiter = detectDelimiter(head as Buffer);

  const rows: { line: number; cells: string[] }[] = [];
  let dataRows = 0;
  let end = 0;
  const parser = createReadStream(path, { start: bom, highWaterMark: chunkSize }).pipe(
    parseStream({ delimiter, relax_column_count: true, info: true, skip_empty_lines: false }),
  );
  try {
    for await (const r of parser as AsyncIterable<{ record: string[]; info: { bytes: number } }>) {
      // Each record starts where the previous one ended (its start line, as in readRecords).
      const line = checker.lineAt(end);
      end = r.info.bytes;
      if (r.record.every((c) => c.trim() === '')) continue;
      if (rows.length > 0) dataRows++;
      // Past the limit the rows are only counted, for the message.
      if (dataRows <= CLASS_IMPORT_MAX_ROWS) rows.push({ line, cells: r.record });
    }
  } catch (err) {
    if (err instanceof CsvError) throw new CsvFileError(describeCsvError(err));
    throw err;
  }
  return toClassList(rows, dataRows, delimiter);
}
