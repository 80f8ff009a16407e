// Recognises a file's format from its first bytes ("magic numbers"), so a renamed executable
// cannot pass as footage (OWASP File Upload Cheat Sheet: validate the content, not only the
// extension). Each signature names the specification it comes from.
import type { FileFormat } from '@midgray/shared';

/** Bytes needed to decide every format below (an MXF run-in, if any, must fit inside). */
export const SNIFF_BYTES = 4096;

const ascii = (buf: Uint8Array, at: number, text: string) => {
  if (buf.length < at + text.length) return false;
  for (let i = 0; i < text.length; i++) if (buf[at + i] !== text.charCodeAt(i)) return false;
  return true;
};
const bytes = (buf: Uint8Array, at: number, sig: readonly number[]) => buf.length >= at + sig.length && sig.every((b, i) => buf[at + i] === b);

// ISO/IEC 14496-12 (ISO base media file format): a file starts with a box, size (4 bytes) then
// type; 'ftyp' comes first in MP4. Older MOV files (the MOV file format's atom layout) may start
// with other top-level atoms: 'moov', 'mdat', 'free', 'skip', 'wide', 'pnot'.
const MOV_FIRST_ATOMS = ['ftyp', 'moov', 'mdat', 'free', 'skip', 'wide', 'pnot'];
// RFC 8794 (EBML): the EBML header element ID 0x1A45DFA3 opens Matroska and WebM files.
const EBML = [0x1a, 0x45, 0xdf, 0xa3];
// SMPTE ST 377-1 (MXF) §5.5: the header partition pack key 06.0E.2B.34.02.05.01.01.0D.01.02.01.01.02
// (byte 14 = kind of partition: 02 header; byte 15 = status), after an optional run-in.
const MXF_PARTITION_KEY = [0x06, 0x0e, 0x2b, 0x34, 0x02, 0x05, 0x01, 0x01, 0x0d, 0x01, 0x02, 0x01, 0x01, 0x02];
// RIFF: "RIFF", 4-byte little-endian size, then the form type "AVI ".
// PNG (ISO/IEC 15948, W3C PNG §5.2): the eight signature bytes 137 80 78 71 13 10 26 10.
const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
// JPEG (ITU-T T.81 §B.1.1.3): SOI marker FF D8, followed by another marker (FF xx).
const JPEG = [0xff, 0xd8, 0xff];
// TIFF 6.0 §2 (Image File Header): "II" 42 (little-endian) or "MM" 42 (big-endian); BigTIFF uses 43.
const TIFF_LE = [0x49, 0x49, 0x2a, 0x00];
const TIFF_BE = [0x4d, 0x4d, 0x00, 0x2a];
const BIGTIFF_LE = [0x49, 0x49, 0x2b, 0x00];
const BIGTIFF_BE = [0x4d, 0x4d, 0x00, 0x2b];
// SMPTE ST 268 (DPX) file information header: magic number 0x53445058 "SDPX" (big-endian) or "XPDS" (little-endian).

/** What sniffing a prefix concluded: a format, not one we know, or too few bytes to tell yet. */
export type SniffResult = { format: FileFormat } | { format: null; needMore: boolean };

/**
 * Returns the format of a file from its first bytes. `complete` says the prefix is the whole file
 * (so a short prefix is final); otherwise fewer than SNIFF_BYTES may answer needMore.
 */
export function sniffFormat(head: Uint8Array, complete = false): SniffResult {
  if (head.length >= 8 && MOV_FIRST_ATOMS.some((t) => ascii(head, 4, t))) return { format: 'isobmff' };
  if (bytes(head, 0, EBML)) return { format: 'matroska' };
  if (ascii(head, 0, 'RIFF') && ascii(head, 8, 'AVI ')) return { format: 'avi' };
  if (bytes(head, 0, PNG)) return { format: 'png' };
  if (bytes(head, 0, JPEG)) return { format: 'jpeg' };
  if ([TIFF_LE, TIFF_BE, BIGTIFF_LE, BIGTIFF_BE].some((sig) => bytes(head, 0, sig))) return { format: 'tiff' };
  if (ascii(head, 0, 'SDPX') || ascii(head, 0, 'XPDS')) return { format: 'dpx' };
  // MXF may carry a run-in before its header partition: search the prefix for the key.
  const limit = head.length - MXF_PARTITION_KEY.length;
  for (let i = 0; i <= limit; i++) {
    if (head[i] === 0x06 && bytes(head, i, MXF_PARTITION_KEY)) return { format: 'mxf' };
  }
  return { format: null, needMore: !complete && head.length < SNIFF_BYTES };
}
