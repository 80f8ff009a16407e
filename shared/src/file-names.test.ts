import { describe, expect, it } from 'vitest';
import { FILE_NAME_MAX_BYTES, fileNameProblem, sanitizeFileName } from './file-names.ts';

// Checks follow the OWASP File Upload Cheat Sheet ("Filename Sanitization"): no path parts,
// no control characters, a length limit, reserved names and characters handled.
describe('fileNameProblem', () => {
  it('when the name carries a path or traversal, then it is refused', () => {
    expect(fileNameProblem('../../etc/passwd')).toMatch(/folder path/);
    expect(fileNameProblem('..\\..\\boot.ini')).toMatch(/folder path/);
    expect(fileNameProblem('clips/A001.mov')).toMatch(/folder path/);
    expect(fileNameProblem('..')).toMatch(/folder path/);
  });
  it('when the name carries control characters (C0, DEL, C1), then it is refused', () => {
    expect(fileNameProblem('A001\u0000.mov')).toMatch(/control characters/);
    expect(fileNameProblem('A001\n.mov')).toMatch(/control characters/);
    expect(fileNameProblem('A001\u007f.mov')).toMatch(/control characters/);
    expect(fileNameProblem('A001\u0085.mov')).toMatch(/control characters/);
  });
  it('when the name is an ordinary clip name (also with spaces and accents), then it passes', () => {
    expect(fileNameProblem('A001_C003 ISO 800.mov')).toBeNull();
    expect(fileNameProblem('Prüfung ½ Blende.mxf')).toBeNull();
    expect(fileNameProblem('')).toMatch(/no name/);
  });
});

describe('sanitizeFileName', () => {
  it('keeps ordinary names as they are', () => {
    expect(sanitizeFileName('A001_C003 ISO 800.mov')).toBe('A001_C003 ISO 800.mov');
  });
  it('removes bidirectional overrides that disguise an extension', () => {
    expect(sanitizeFileName('grab\u202egnp.exe')).toBe('grabgnp.exe');
  });
  it('replaces characters some file systems reserve and prefixes reserved device names', () => {
    expect(sanitizeFileName('take: 1 "best"?.mov')).toBe('take_ 1 _best__.mov');
    expect(sanitizeFileName('CON.mov')).toBe('_CON.mov');
    expect(sanitizeFileName('lpt1')).toBe('_lpt1');
  });
  it('trims leading dots (hidden files) and trailing dots and spaces', () => {
    expect(sanitizeFileName('..hidden.mov. ')).toBe('hidden.mov');
    expect(sanitizeFileName(' ... ')).toBe('file');
  });
  it('normalises to NFC, so a decomposed "ü" equals the composed one', () => {
    expect(sanitizeFileName('Pru\u0308fung.mov')).toBe('Pr\u00fcfung.mov');
  });
  it('clips long names to 255 UTF-8 bytes and keeps the extension, never splitting a character', () => {
    const long = `${'ü'.repeat(300)}.mov`;
    const out = sanitizeFileName(long);
    expect(new TextEncoder().encode(out).length).toBeLessThanOrEqual(FILE_NAME_MAX_BYTES);
    expect(out.endsWith('.mov')).toBe(true);
    expect(out.startsWith('üü')).toBe(true);
    expect(out).not.toContain('\ufffd');
  });
});
