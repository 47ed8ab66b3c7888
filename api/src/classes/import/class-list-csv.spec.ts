import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { stringify } from 'csv-stringify/sync';
import { CLASS_IMPORT_MAX_ROWS, CLASS_LIST_COLUMNS } from '@stavemark/shared';
import {
  checkCsvBytes,
  CsvFileError,
  detectDelimiter,
  firstInvalidUtf8,
  parseClassList,
  parseClassListFile,
  readRecords,
} from './class-list-csv.js';

const bytes = (s: string): Uint8Array => new TextEncoder().encode(s);
const records = (s: string, d: ',' | ';' = ',') => readRecords(bytes(s), d).map((r) => r.cells);
const HEADER = CLASS_LIST_COLUMNS.map((c) => c.header).join(',');
const ROW = 'KL2001,Ada,Pendry,,2017-03-08,Robin Pendry,robin.pendry@family.example,1,MON-FND';

describe('RFC 4180 section 2 examples (IETF RFC 4180, "Common Format and MIME Type for CSV Files", §2 rules 1–7)', () => {
  it('rule 1: records on separate lines, delimited by CRLF', () => {
    expect(records('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n')).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });
  it('rule 2: the last record may have no ending line break', () => {
    expect(records('aaa,bbb,ccc\r\nzzz,yyy,xxx')).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });
  it('rule 3: an optional header line in the same format', () => {
    expect(records('field_name,field_name,field_name\r\naaa,bbb,ccc\r\nzzz,yyy,xxx\r\n')).toEqual([
      ['field_name', 'field_name', 'field_name'],
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });
  it('rule 4: spaces are part of a field', () => {
    expect(records('aaa, bbb ,ccc')).toEqual([['aaa', ' bbb ', 'ccc']]);
  });
  it('rule 5: fields may be enclosed in double quotes', () => {
    expect(records('"aaa","bbb","ccc"\r\nzzz,yyy,xxx')).toEqual([
      ['aaa', 'bbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
  });
  it('rule 6: line breaks, double quotes and commas inside quoted fields', () => {
    expect(records('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx')).toEqual([
      ['aaa', 'b\r\nbb', 'ccc'],
      ['zzz', 'yyy', 'xxx'],
    ]);
    expect(records('"a,a","bbb","ccc"')).toEqual([['a,a', 'bbb', 'ccc']]);
  });
  it('rule 7: a double quote inside a quoted field is written twice', () => {
    expect(records('"aaa","b""bb","ccc"')).toEqual([['aaa', 'b"bb', 'ccc']]);
  });
});

describe('what spreadsheets produce', () => {
  it('LF line ends, a UTF-8 byte-order mark, blank trailing lines and lines of only commas', () => {
    const file = `\uFEFF${HEADER}\n${ROW}\n,,,,,,,,\n\n\n`;
    const p = parseClassList(bytes(file));
    expect(p.records).toHaveLength(1);
    expect(p.records[0]!.line).toBe(2);
    expect(p.records[0]!.cells.pupilNumber).toBe('KL2001');
  });

  it('semicolon delimiters (spreadsheets in locales with a decimal comma)', () => {
    const file = `${HEADER.replaceAll(',', ';')}\r\n${ROW.replaceAll(',', ';')}\r\n`;
    expect(detectDelimiter(bytes(file))).toBe(';');
    const p = parseClassList(bytes(file));
    expect(p.delimiter).toBe(';');
    expect(p.records[0]!.cells.guardianEmail).toBe('robin.pendry@family.example');
  });

  it('a comma inside a quoted header does not make the file look comma-separated', () => {
    expect(detectDelimiter(bytes('"a,b,c";d;e\n'))).toBe(';');
  });

  it('header names in any case and order, with spaces, hyphens or underscores', () => {
    const file =
      'CLASS CODE,given_name,Family-Name,pupil number,date of birth,Guardian Email,guardian name\n' +
      'WED-INT,Bram,Everleigh,KL2002,2016-02-08,jo@family.example,Jo Everleigh\n';
    const r = parseClassList(bytes(file)).records[0]!;
    expect(r.cells).toEqual({
      classCode: 'WED-INT',
      givenName: 'Bram',
      familyName: 'Everleigh',
      pupilNumber: 'KL2002',
      dateOfBirth: '2016-02-08',
      guardianEmail: 'jo@family.example',
      guardianName: 'Jo Everleigh',
    });
  });

  it('a quoted line break keeps the record together and later records keep their true line numbers', () => {
    const file = `${HEADER}\r\nKL2001,"Ada\r\nMay",Pendry,,2017-03-08,Robin Pendry,robin@family.example,1,MON-FND\r\n${ROW.replace('KL2001', 'KL2003')}\r\n`;
    const p = parseClassList(bytes(file));
    expect(p.records.map((r) => r.line)).toEqual([2, 4]);
    expect(p.records[0]!.cells.givenName).toBe('Ada\r\nMay');
  });

  it('what csv-stringify writes reads back the same (general-purpose library as the writer)', () => {
    const cells = [
      'KL9',
      'Zoë "Zo"',
      "O'Neill, Jr",
      '',
      '2010-01-01',
      'Ana\nLee',
      'ana@family.example',
      '',
      'A',
    ];
    const text = stringify([CLASS_LIST_COLUMNS.map((c) => c.header), cells], {
      bom: true,
      record_delimiter: 'windows',
    });
    const p = parseClassList(bytes(text));
    expect(Object.values(p.records[0]!.cells)).toEqual(cells);
  });
});

describe('bad files are refused whole, with a message that says what to do', () => {
  const refused = (input: Uint8Array | string) => {
    try {
      parseClassList(typeof input === 'string' ? bytes(input) : input);
    } catch (e) {
      expect(e).toBeInstanceOf(CsvFileError);
      return (e as Error).message;
    }
    throw new Error('expected the file to be refused');
  };

  it('binary bytes (the start of a ZIP-based workbook)', () => {
    const zip = Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00, 0x08, 0x00]);
    expect(refused(zip)).toMatch(/not a CSV text file: line 1 contains the control byte 0x03/);
  });

  it('Latin-1 text: says it is not UTF-8 and where, and imports no mojibake', () => {
    // "Zoë" in ISO-8859-1 is 5A 6F EB: EB starts a three-byte UTF-8 sequence that does not follow.
    const latin1 = Uint8Array.from([
      ...bytes(`${HEADER}\nKL1,Zo`),
      0xeb,
      ...bytes(',Pendry,,2010-01-01,,,,A\n'),
    ]);
    expect(refused(latin1)).toMatch(
      /not UTF-8 text: line 2 has the byte 0xEB.*Latin-1 or Windows-1252/,
    );
  });

  it('a missing header (the first line is data)', () => {
    expect(refused(`${ROW}\n${ROW}\n`)).toMatch(/Line 1 should name the columns/);
  });

  it('a missing required column names it', () => {
    const header = CLASS_LIST_COLUMNS.filter((c) => c.key !== 'dateOfBirth')
      .map((c) => c.header)
      .join(',');
    expect(refused(`${header}\nKL1,Ada,Pendry,,Robin,r@family.example,1,A\n`)).toMatch(
      /no “Date of birth” column/,
    );
  });

  it('an extra, unknown column', () => {
    expect(refused(`${HEADER},Notes\n${ROW},likes Bach\n`)).toMatch(/Unknown column “Notes”/);
  });

  it('the same column twice', () => {
    expect(refused(`${HEADER},given name\n${ROW},Ada\n`)).toMatch(/are the same column/);
  });

  it(`more than ${CLASS_IMPORT_MAX_ROWS} rows`, () => {
    const rows = Array.from({ length: CLASS_IMPORT_MAX_ROWS + 1 }, (_, i) =>
      ROW.replace('KL2001', `P${i}`),
    );
    expect(refused(`${HEADER}\n${rows.join('\n')}\n`)).toMatch(
      /5,001 rows of students; the limit is 5,000/,
    );
  });

  it('exactly the limit is accepted', () => {
    const rows = Array.from({ length: CLASS_IMPORT_MAX_ROWS }, (_, i) =>
      ROW.replace('KL2001', `P${i}`),
    );
    expect(parseClassList(bytes(`${HEADER}\n${rows.join('\n')}\n`)).records).toHaveLength(
      CLASS_IMPORT_MAX_ROWS,
    );
  });

  it('more than 2 MB', () => {
    expect(() => checkCsvBytes(new Uint8Array(2 * 1024 * 1024 + 1).fill(0x41))).toThrow(
      /limit is 2 MB/,
    );
  });

  it('an empty file, and a file of blank lines', () => {
    expect(refused('')).toMatch(/empty/);
    expect(refused('\r\n\r\n')).toMatch(/no header line/);
  });

  it('an unclosed quote', () => {
    expect(refused(`${HEADER}\nKL1,"Ada,Pendry,,2010-01-01,,,,A\n`)).toMatch(/never closed/);
  });

  it('a record with more fields than the header is a row error, not a file error', () => {
    const p = parseClassList(bytes(`${HEADER}\n${ROW},extra\n`));
    expect(p.records[0]!.shapeError).toMatch(/10 fields but the header has 9/);
  });
});

describe('UTF-8 validation (RFC 3629 §4 syntax)', () => {
  it('accepts valid sequences and finds the first invalid one', () => {
    expect(firstInvalidUtf8(bytes('plain, Zoë, 音楽, 🎹'))).toBe(-1);
    expect(firstInvalidUtf8(Uint8Array.from([0x41, 0xc0, 0x80]))).toBe(1); // overlong NUL
    expect(firstInvalidUtf8(Uint8Array.from([0xed, 0xa0, 0x80]))).toBe(0); // UTF-16 surrogate
    expect(firstInvalidUtf8(Uint8Array.from([0x41, 0xe2, 0x82]))).toBe(1); // cut off
    expect(firstInvalidUtf8(Uint8Array.from([0xf4, 0x90, 0x80, 0x80]))).toBe(0); // past U+10FFFF
  });
});

describe('the streamed read of an uploaded file (parseClassListFile) agrees with the whole-file read', () => {
  const dir = mkdtempSync(join(tmpdir(), 'stavemark-csv-spec-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  let n = 0;
  const outcome = async (read: () => unknown) => {
    try {
      return { ok: await read() };
    } catch (e) {
      expect(e).toBeInstanceOf(CsvFileError);
      return { refused: (e as Error).message };
    }
  };
  const rows = Array.from({ length: 40 }, (_, i) => ROW.replace('KL2001', `P${i}`));
  const cases: [string, Uint8Array][] = [
    ['BOM, CRLF, quoted line breaks and multi-byte names', bytes(`\uFEFF${HEADER}\r\nKL1,"Zoë\r\nAnn",音楽,,2010-01-01,"Pendry, Sam",s@family.example,1,A\r\n${rows.join('\r\n')}\r\n\r\n`)],
    ['emoji at every offset', bytes(`${HEADER}\n${rows.map((r, i) => r.replace('Ada', '🎹'.repeat(1 + (i % 4)))).join('\n')}\n`)],
    ['semicolons', bytes(`${HEADER.replaceAll(',', ';')}\n${ROW.replaceAll(',', ';')}\n`)],
    ['Latin-1 after many lines', Uint8Array.from([...bytes(`${HEADER}\n${rows.join('\n')}\nKL1,Zo`), 0xeb, ...bytes(',Pendry,,2010-01-01,,,,A\n')])],
    ['a UTF-8 character cut off at the end', Uint8Array.from([...bytes(`${HEADER}\n${ROW}`), 0xe2, 0x82])],
    ['a control byte on line 3', bytes(`${HEADER}\n${ROW}\n${ROW.replace('Ada', 'A\u0001da')}\n`)],
    ['binary', Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00])],
    ['an unclosed quote', bytes(`${HEADER}\nKL1,"Ada,Pendry,,2010-01-01,,,,A\n`)],
    ['only blank lines', bytes('\r\n\r\n')],
    ['a missing header', bytes(`${ROW}\n${ROW}\n`)],
    ['more than the row limit', bytes(`${HEADER}\n${Array.from({ length: CLASS_IMPORT_MAX_ROWS + 2 }, (_, i) => ROW.replace('KL2001', `P${i}`)).join('\n')}\n`)],
  ];
  for (const [name, input] of cases) {
    it(name, async () => {
      const path = join(dir, `case-${n++}.csv`);
      writeFileSync(path, input);
      const whole = await outcome(() => parseClassList(input));
      // Chunks of 1, 2, 3 and 5 bytes cut every multi-byte character and CRLF somewhere.
      for (const chunk of [1, 2, 3, 5, 64 * 1024]) {
        if (chunk < 64 * 1024 && input.length > 20_000) continue; // the long file only in big chunks
        expect(await outcome(() => parseClassListFile(path, input.length, chunk))).toEqual(whole);
      }
    });
  }
  it('an empty upload and one over 2 MB are refused before reading', async () => {
    await expect(parseClassListFile(join(dir, 'nothing.csv'), 0)).rejects.toThrow(/empty/);
    await expect(parseClassListFile(join(dir, 'nothing.csv'), 2 * 1024 * 1024 + 1)).rejects.toThrow(
      /limit is 2 MB/,
    );
  });
});
