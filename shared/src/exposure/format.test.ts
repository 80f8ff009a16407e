import { describe, expect, it } from 'vitest';
import { formatAngle, formatDensity, formatFNumber, formatFps, formatSeconds, formatStops } from './format.ts';

describe('formatStops', () => {
  it('writes thirds as fractions with a sign and a true minus', () => {
    expect(formatStops(4 / 3)).toBe('+1⅓');
    expect(formatStops(-4 / 3)).toBe('−1⅓');
    expect(formatStops(-2 / 3)).toBe('−⅔');
    expect(formatStops(3)).toBe('+3');
    expect(formatStops(0)).toBe('0');
  });
  it('writes values off the third-stop grid with two decimals', () => {
    expect(formatStops(0.27)).toBe('+0.27');
    expect(formatStops(-0.001)).toBe('0');
  });
});

describe('exposure labels', () => {
  it('labels NTSC-family rates the way the trade writes them', () => {
    // 24000/1001 = 23.976…, 30000/1001 = 29.97…, 60000/1001 = 59.94… (common practice labels).
    expect(formatFps(24000 / 1001)).toBe('23.976 fps');
    expect(formatFps(30000 / 1001)).toBe('29.97 fps');
    expect(formatFps(60000 / 1001)).toBe('59.94 fps');
    expect(formatFps(25)).toBe('25 fps');
  });
  it('labels exposure times as fractions below one second', () => {
    // common practice: 180° at 23.976 fps (1001/48000 s) is called 1/48 s.
    expect(formatSeconds(1001 / 48000)).toBe('1/48 s');
    expect(formatSeconds(1 / 50)).toBe('1/50 s');
    expect(formatSeconds(0.4)).toBe('0.4 s');
    expect(formatSeconds(2)).toBe('2 s');
  });
  it('labels angles, f-numbers and densities', () => {
    expect(formatAngle(172.8)).toBe('172.8°');
    expect(formatFNumber(5.6)).toBe('f/5.6');
    expect(formatDensity(0)).toBe('0.0');
    expect(formatDensity(0.9)).toBe('0.9');
    expect(formatDensity(0.15)).toBe('0.15');
  });
});
