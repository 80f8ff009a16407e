import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { SNIFF_BYTES, sniffFormat } from './sniff.ts';

const b = (...xs: number[]) => Uint8Array.from(xs);
const text = (s: string) => Uint8Array.from(Buffer.from(s, 'latin1'));
const cat = (...parts: Uint8Array[]) => Uint8Array.from(Buffer.concat(parts));

describe('sniffFormat against the published signatures', () => {
  it('MP4: a box of type ftyp at byte 4 (ISO/IEC 14496-12 §4.3)', () => {
    expect(sniffFormat(cat(b(0, 0, 0, 0x20), text('ftypisom')))).toEqual({ format: 'isobmff' });
  });
  it('MOV without ftyp: a first atom moov, mdat or wide (the MOV file format\'s atom layout)', () => {
    expect(sniffFormat(cat(b(0, 0, 0, 8), text('wide'), b(0, 0, 0, 8), text('mdat')))).toEqual({ format: 'isobmff' });
    expect(sniffFormat(cat(b(0, 0, 1, 0), text('moov')))).toEqual({ format: 'isobmff' });
  });
  it('Matroska/WebM: EBML header ID 1A 45 DF A3 (RFC 8794 §11.2.1)', () => {
    expect(sniffFormat(b(0x1a, 0x45, 0xdf, 0xa3, 0x9f, 0x42, 0x86))).toEqual({ format: 'matroska' });
  });
  it('MXF: header partition pack key 06 0E 2B 34 02 05 01 01 0D 01 02 01 01 02 (SMPTE ST 377-1 §7.1), also after a run-in', () => {
    const key = b(0x06, 0x0e, 0x2b, 0x34, 0x02, 0x05, 0x01, 0x01, 0x0d, 0x01, 0x02, 0x01, 0x01, 0x02, 0x04, 0x00);
    expect(sniffFormat(key)).toEqual({ format: 'mxf' });
    expect(sniffFormat(cat(new Uint8Array(100).fill(0x55), key))).toEqual({ format: 'mxf' });
  });
  it('AVI: "RIFF", size, "AVI " (the RIFF / AVI file format)', () => {
    expect(sniffFormat(cat(text('RIFF'), b(0xf0, 0x1d, 0, 0), text('AVI LIST')))).toEqual({ format: 'avi' });
    // A WAVE file is RIFF too, but not video.
    expect(sniffFormat(cat(text('RIFF'), b(0xf0, 0x1d, 0, 0), text('WAVEfmt ')), true)).toEqual({ format: null, needMore: false });
  });
  it('PNG: 89 50 4E 47 0D 0A 1A 0A (ISO/IEC 15948 / W3C PNG §5.2)', () => {
    expect(sniffFormat(b(0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a))).toEqual({ format: 'png' });
  });
  it('JPEG: SOI FF D8 then a marker FF (ITU-T T.81 Annex B)', () => {
    expect(sniffFormat(b(0xff, 0xd8, 0xff, 0xe0))).toEqual({ format: 'jpeg' });
  });
  it('TIFF: II*\\0 or MM\\0* (TIFF 6.0 §2), and BigTIFF 43', () => {
    expect(sniffFormat(b(0x49, 0x49, 0x2a, 0x00))).toEqual({ format: 'tiff' });
    expect(sniffFormat(b(0x4d, 0x4d, 0x00, 0x2a))).toEqual({ format: 'tiff' });
    expect(sniffFormat(b(0x49, 0x49, 0x2b, 0x00))).toEqual({ format: 'tiff' });
  });
  it('DPX: magic number SDPX (big-endian) or XPDS (little-endian) (SMPTE ST 268)', () => {
    expect(sniffFormat(text('SDPX\0\0\0\0'))).toEqual({ format: 'dpx' });
    expect(sniffFormat(text('XPDS\0\0\0\0'))).toEqual({ format: 'dpx' });
  });
  it('refuses what is not footage: an ELF or PE executable, a ZIP, a shell script, an HTML page', () => {
    const full = (x: Uint8Array) => sniffFormat(cat(x, new Uint8Array(SNIFF_BYTES)), false);
    expect(full(b(0x7f, 0x45, 0x4c, 0x46))).toEqual({ format: null, needMore: false }); // ELF
    expect(full(text('MZ\x90\0'))).toEqual({ format: null, needMore: false }); // PE
    expect(full(b(0x50, 0x4b, 0x03, 0x04))).toEqual({ format: null, needMore: false }); // ZIP
    expect(full(text('#!/bin/sh\n'))).toEqual({ format: null, needMore: false });
    expect(full(text('<!doctype html>'))).toEqual({ format: null, needMore: false });
  });
  it('asks for more bytes while a short prefix could still be MXF after a run-in, unless the file is complete', () => {
    expect(sniffFormat(b(0, 1, 2))).toEqual({ format: null, needMore: true });
    expect(sniffFormat(b(0, 1, 2), true)).toEqual({ format: null, needMore: false });
  });
});

// The reference encoder: files written by FFmpeg's own muxers must be recognised.
describe('sniffFormat on files FFmpeg writes', () => {
  const dir = mkdtempSync(join(tmpdir(), 'midgray-sniff-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));
  const cases: [string, string[], string][] = [
    ['mp4', [], 'isobmff'],
    ['mov', [], 'isobmff'],
    ['mkv', [], 'matroska'],
    ['webm', ['-c:v', 'libvpx-vp9'], 'matroska'],
    ['avi', [], 'avi'],
    ['mxf', ['-s', '720x576', '-c:v', 'mpeg2video'], 'mxf'],
    ['png', [], 'png'],
    ['jpg', [], 'jpeg'],
    ['tiff', [], 'tiff'],
    ['dpx', [], 'dpx'],
  ];
  for (const [ext, args, format] of cases) {
    it(`recognises FFmpeg's .${ext} as ${format}`, () => {
      const out = join(dir, `clip.${ext}`);
      execFileSync('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', 'testsrc=size=64x64:rate=25', '-frames:v', ['png', 'jpg', 'tiff', 'dpx'].includes(ext) ? '1' : '2', ...args, out]);
      const head = readFileSync(out).subarray(0, SNIFF_BYTES);
      expect(sniffFormat(head, true)).toEqual({ format });
    });
  }
});
