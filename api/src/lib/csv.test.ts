import { describe, expect, it } from 'vitest';
import { csvField, guardFormula, toCsv } from './csv.ts';

// Expected texts follow RFC 4180 section 2 (rules 1–7) and its worked examples.
describe('CSV (RFC 4180)', () => {
  it('ends every record with CRLF, the last one too (RFC 4180 §2 rules 1–2)', () => {
    expect(toCsv([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']])).toBe('aaa,bbb,ccc\r\nzzz,yyy,xxx\r\n');
  });

  it('encloses fields with commas, quotes or line breaks in double quotes (RFC 4180 §2 rule 6)', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('line 1\r\nline 2')).toBe('"line 1\r\nline 2"');
    expect(csvField('only\nLF')).toBe('"only\nLF"');
  });

  it('doubles a double quote inside a quoted field (RFC 4180 §2 rule 7: "b""bb")', () => {
    expect(csvField('b"bb')).toBe('"b""bb"');
    expect(toCsv([['aaa', 'b"bb', 'ccc']])).toBe('aaa,"b""bb",ccc\r\n');
  });

  it('leaves plain fields, numbers and empty cells unquoted', () => {
    expect(toCsv([['ISO 800', 5.6, null, undefined, '']])).toBe('ISO 800,5.6,,,\r\n');
    expect(csvField(Number.NaN)).toBe('');
  });

  it('defuses a leading formula character in text a person typed (OWASP CSV injection guidance)', () => {
    expect(guardFormula('=SUM(A1:A9)')).toBe("'=SUM(A1:A9)");
    expect(guardFormula('@cmd')).toBe("'@cmd");
    expect(guardFormula('-2+3')).toBe("'-2+3");
    expect(guardFormula('Clean at ISO 800')).toBe('Clean at ISO 800');
    // the typographic minus the plan writes ("−3") is not a formula character
    expect(guardFormula('−3 stops')).toBe('−3 stops');
  });
});
