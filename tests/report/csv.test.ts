import { describe, expect, it } from 'vitest';
import { formatCsvNumber, parseCsv, toCsv, type CsvCell } from '../../engine/report/index.ts';

describe('toCsv', () => {
  it('ends every record with CRLF and separates fields with commas', () => {
    // Source: RFC 4180 (2005), section 2, rules 1, 3 and 4: records end in CRLF, the header has the record format, fields are comma-separated
    expect(toCsv(['f_Hz', 'TL_dB'], [[125, 3.5], [250, 7]])).toBe('f_Hz,TL_dB\r\n125,3.5\r\n250,7\r\n');
  });

  it('quotes fields with commas, quotes, CR or LF, doubling the quotes, and only those', () => {
    const csv = toCsv(['a', 'b', 'c', 'd', 'e'], [['x,y', 'say "hi"', 'two\r\nlines', 'lf\nonly', 'plain text']]);
    // Source: RFC 4180 (2005), section 2, rules 6 and 7: fields with line breaks, quotes or commas are enclosed in quotes; inner quotes are doubled
    expect(csv.split('\r\n')[1]).toBe('"x,y","say ""hi""","two');
    // Source: as above
    expect(csv).toContain('"lf\nonly",plain text\r\n');
  });

  it('writes null as an empty field, and a lone empty field as "" so the record is not lost', () => {
    expect(toCsv(['a', 'b', 'c'], [[null, 1, null]])).toBe('a,b,c\r\n,1,\r\n');
    expect(toCsv(['only'], [[null], ['']])).toBe('only\r\n""\r\n""\r\n');
  });

  it('refuses ragged rows and an empty header', () => {
    expect(() => toCsv(['a', 'b'], [[1]])).toThrow(RangeError);
    expect(() => toCsv([], [])).toThrow(RangeError);
    expect(() => toCsv(['a'], [[1]], { significantDigits: 0 })).toThrow(RangeError);
  });
});

describe('formatCsvNumber', () => {
  it('writes numbers with a point and no grouping, to 8 significant digits', () => {
    expect(formatCsvNumber(1 / 3)).toBe('0.33333333');
    expect(formatCsvNumber(1234.56789012)).toBe('1234.5679');
    expect(formatCsvNumber(0.1)).toBe('0.1');
    expect(formatCsvNumber(-2.5e-7)).toBe('-2.5e-7');
    expect(formatCsvNumber(6.02214076e23)).toBe('6.0221408e+23');
    expect(formatCsvNumber(123456789012)).toBe('123456789012');
    expect(formatCsvNumber(-0)).toBe('0');
    expect(formatCsvNumber(Math.PI, 4)).toBe('3.142');
  });

  it('writes non-finite values so that Number() reads them back', () => {
    for (const x of [Number.NaN, Infinity, -Infinity]) expect(Number(formatCsvNumber(x))).toBe(x);
  });
});

describe('parseCsv', () => {
  it('reads the RFC 4180 examples', () => {
    // Source: RFC 4180 (2005), section 2, rules 1–2: CRLF between records, final line break optional
    expect(parseCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    // Source: as above
    expect(parseCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx')).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    // Source: RFC 4180 (2005), section 2, rule 6: a quoted field may hold CRLF
    expect(parseCsv('"aaa","b\r\nbb","ccc"\r\nzzz,yyy,xxx\r\n')).toEqual([['aaa', 'b\r\nbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
    // Source: RFC 4180 (2005), section 2, rule 7: a quote inside a quoted field is doubled
    expect(parseCsv('"aaa","b""bb","ccc"\r\n')).toEqual([['aaa', 'b"bb', 'ccc']]);
  });

  it('keeps empty fields, including at the end of a record and of the text', () => {
    expect(parseCsv('a,,b\r\n,\r\n')).toEqual([['a', '', 'b'], ['', '']]);
    expect(parseCsv('a,')).toEqual([['a', '']]);
    expect(parseCsv('""\r\n')).toEqual([['']]);
    expect(parseCsv('')).toEqual([]);
  });

  it('accepts LF line ends', () => {
    expect(parseCsv('a,b\nc,d\n')).toEqual([['a', 'b'], ['c', 'd']]);
  });

  it('rejects malformed quoting', () => {
    expect(() => parseCsv('a,"b\r\n')).toThrow(SyntaxError);
    expect(() => parseCsv('a,b"c\r\n')).toThrow(SyntaxError);
    expect(() => parseCsv('"a"b,c\r\n')).toThrow(SyntaxError);
  });
});

describe('round trip', () => {
  it('reads back what it writes', () => {
    // A small deterministic generator (LCG, Knuth's MMIX constants) for varied cells.
    let seed = 12345n;
    const next = () => {
      seed = (seed * 6364136223846793005n + 1442695040888963407n) & ((1n << 64n) - 1n);
      return Number(seed >> 11n) / 2 ** 53;
    };
    const pieces = ['a', ',', '"', '\r\n', '\n', '\r', ' ', 'dB(A)', 'é', ''];
    const cell = (): CsvCell => {
      const u = next();
      if (u < 0.15) return null;
      if (u < 0.55) return (next() - 0.5) * 10 ** Math.floor(next() * 20 - 10);
      return Array.from({ length: Math.floor(next() * 5) }, () => pieces[Math.floor(next() * pieces.length)]).join('');
    };
    const header = ['frequency, Hz', 'level "L"', 'note'];
    const rows = Array.from({ length: 200 }, () => [cell(), cell(), cell()]);
    const back = parseCsv(toCsv(header, rows));
    expect(back[0]).toEqual(header);
    expect(back).toHaveLength(rows.length + 1);
    rows.forEach((row, i) => {
      row.forEach((value, j) => {
        const text = back[i + 1][j];
        if (value === null) expect(text).toBe('');
        else if (typeof value === 'string') expect(text).toBe(value);
        // Eight significant digits: relative error at most half a unit in the 8th digit.
        else expect(Math.abs(Number(text) - value)).toBeLessThanOrEqual(5e-8 * Math.abs(value));
      });
    });
  });

  it('keeps full precision with 17 significant digits', () => {
    const values = [Math.PI, 1 / 3, 2 ** -40, 1e300 / 7];
    const back = parseCsv(toCsv(['x'], values.map((v) => [v]), { significantDigits: 17 }));
    expect(back.slice(1).map((r) => Number(r[0]))).toEqual(values);
  });
});
