// File names as people send them: the original is kept for display and downloads only; storage
// never uses it. Following the OWASP File Upload Cheat Sheet: refuse path parts and control
// characters outright, tidy the rest (reserved characters, bidirectional overrides, length).

/** Longest stored name, in UTF-8 bytes (common file systems allow 255). */
export const FILE_NAME_MAX_BYTES = 255;

// C0 and C1 control characters, and DEL.
const CONTROL = /[\u0000-\u001f\u007f-\u009f]/;
// Bidirectional embeddings, overrides and isolates: they make "evil‮gpj.exe" read as "evilexe.jpg".
const BIDI = /[\u202a-\u202e\u2066-\u2069\u200e\u200f\u061c]/g;
// Characters some desktop file systems forbid in names; replaced so a downloaded copy saves everywhere.
const RESERVED = /[<>:"|?*]/g;
// Device names some desktop systems reserve, with or without an extension.
const RESERVED_DEVICES = /^(con|prn|aux|nul|com[0-9]|lpt[0-9])(\..*)?$/i;

/** Returns why a client's file name is refused (path parts, traversal, control characters), or null when acceptable. */
export function fileNameProblem(name: string): string | null {
  if (!name || !name.trim()) return 'The file has no name';
  if (CONTROL.test(name)) return `The file name contains control characters: rename the file and try again`;
  if (/[\\/]/.test(name) || name === '.' || name === '..') return `The file name "${name}" contains a folder path: send the file's own name only`;
  return null;
}

const utf8Length = (s: string) => new TextEncoder().encode(s).length;

/** Shortens `s` to at most `maxBytes` UTF-8 bytes without splitting a character. */
function clipBytes(s: string, maxBytes: number): string {
  let out = '';
  for (const ch of s) {
    if (utf8Length(out + ch) > maxBytes) break;
    out += ch;
  }
  return out;
}

/**
 * Returns a tidy display name: Unicode NFC, bidirectional controls removed, reserved characters
 * replaced by "_", runs of white space collapsed, no leading or trailing dots or spaces, reserved
 * device names prefixed with "_", at most 255 UTF-8 bytes with the extension kept. Call
 * fileNameProblem first: path separators and control characters are refused, not tidied.
 */
export function sanitizeFileName(name: string): string {
  let s = name.normalize('NFC').replace(BIDI, '').replace(RESERVED, '_').replace(/\s+/g, ' ');
  s = s.replace(/^[\s.]+/, '').replace(/[\s.]+$/, '');
  if (!s) return 'file';
  if (RESERVED_DEVICES.test(s)) s = `_${s}`;
  if (utf8Length(s) > FILE_NAME_MAX_BYTES) {
    const dot = s.lastIndexOf('.');
    const ext = dot > 0 && s.length - dot <= 16 ? s.slice(dot) : '';
    s = clipBytes(s.slice(0, s.length - ext.length), FILE_NAME_MAX_BYTES - utf8Length(ext)) + ext;
  }
  return s;
}
