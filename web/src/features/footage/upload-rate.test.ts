import { describe, expect, it } from 'vitest';
import {
  formatSpeed,
  formatTimeLeft,
  quarterAnnouncement,
  quarterPassed,
  RATE_TIME_CONSTANT_SECONDS,
  rateAt,
  restartClock,
  sampleRate,
  secondsLeft,
  startRate,
  STALL_AFTER_SECONDS,
  type RateEstimate,
} from './upload-rate.ts';

const MB = 1_000_000;

/** Feeds `count` samples, one every `everyMs`, each `bytesEach` more than the last. */
function feed(estimate: RateEstimate, count: number, bytesEach: number, everyMs: number): RateEstimate {
  let e = estimate;
  for (let i = 0; i < count; i++) e = sampleRate(e, e.bytes + bytesEach, e.atMs + everyMs);
  return e;
}

describe('upload speed, smoothed', () => {
  it('reads a steady 10 MB every second as 10.0 MB/s, with the right time left', () => {
    const e = feed(startRate(0, 0), 5, 10 * MB, 1000);
    expect(e.bytesPerSecond).toBeCloseTo(10 * MB, 6);
    expect(formatSpeed(rateAt(e, e.atMs + 500))).toBe('10.0 MB/s');
    // 50 MB sent of 1.35 GB: 1.3 GB left at 10 MB/s is 130 s.
    expect(secondsLeft(1350 * MB - e.bytes, e.bytesPerSecond)).toBeCloseTo(130, 6);
    expect(formatTimeLeft(secondsLeft(1350 * MB - e.bytes, e.bytesPerSecond))).toBe('about 2 min 10 s left');
  });

  it('has no speed from a single sample', () => {
    const e = startRate(0, 0);
    expect(e.bytesPerSecond).toBeNull();
    expect(formatSpeed(rateAt(e, 10_000))).toBe('—');
  });

  it('weighs samples of any length by time, like a first-order low-pass filter', () => {
    // A step from 10 to 20 MB/s: after one time constant the estimate has covered 1 − 1/e (63.2 %) of the step
    // (step response of a first-order system, y(t) = 1 − e^(−t/τ); IEC 60050-351, "time constant").
    // The 3 s constant itself is a choice of ours (`common practice` for transfer meters).
    const before = feed(startRate(0, 0), 5, 10 * MB, 1000);
    const after = feed(before, RATE_TIME_CONSTANT_SECONDS, 20 * MB, 1000);
    expect(after.bytesPerSecond! / MB).toBeCloseTo(20 - 10 * Math.exp(-1), 6);
    // The same 20 MB/s sampled in uneven steps (250 ms, then 750 ms) lands on the same estimate.
    const uneven = [0, 1, 2].reduce((e) => sampleRate(sampleRate(e, e.bytes + 5 * MB, e.atMs + 250), e.bytes + 20 * MB, e.atMs + 1000), before);
    expect(uneven.bytesPerSecond! / MB).toBeCloseTo(after.bytesPerSecond! / MB, 6);
  });

  it('lowers the speed during a stall, smoothly, and after the slow sample that ends it', () => {
    const e = feed(startRate(0, 0), 5, 10 * MB, 1000);
    // Events a second apart are normal: nothing changes before the allowance runs out.
    expect(rateAt(e, e.atMs + STALL_AFTER_SECONDS * 1000)).toBe(10 * MB);
    const a = rateAt(e, e.atMs + 2000)!;
    const b = rateAt(e, e.atMs + 5000)!;
    expect(a).toBeLessThan(10 * MB);
    expect(b).toBeLessThan(a);
    // 3.5 s of silence past the allowance: 10 MB/s × e^(−3.5/3).
    expect(formatSpeed(b)).toBe('3.1 MB/s');
    // The stall ends with 10 MB after 5 s (2 MB/s over that stretch): the estimate drops well below 10 MB/s.
    const resumed = sampleRate(e, e.bytes + 10 * MB, e.atMs + 5000);
    expect(resumed.bytesPerSecond! / MB).toBeCloseTo(10 + (1 - Math.exp(-5 / 3)) * (2 - 10), 6);
  });

  it('does not count paused time as slow once the clock is restarted', () => {
    const e = feed(startRate(0, 0), 5, 10 * MB, 1000);
    const later = restartClock(e, e.atMs + 60_000);
    const next = sampleRate(later, later.bytes + 10 * MB, later.atMs + 1000);
    expect(next.bytesPerSecond).toBeCloseTo(10 * MB, 6);
  });

  it('restarts the clock, keeping the speed, when a resumed upload goes back to the server’s offset', () => {
    const e = feed(startRate(0, 0), 5, 10 * MB, 1000);
    const back = sampleRate(e, 42 * MB, e.atMs + 1000);
    expect(back).toEqual({ bytesPerSecond: 10 * MB, bytes: 42 * MB, atMs: e.atMs + 1000 });
    expect(sampleRate(back, 52 * MB, back.atMs + 1000).bytesPerSecond).toBeCloseTo(10 * MB, 6);
  });

  it('reads nothing sent as zero speed, shown as "—", and never an infinite time left', () => {
    const e = feed(startRate(5 * MB, 0), 3, 0, 1000);
    expect(e.bytesPerSecond).toBe(0);
    expect(formatSpeed(e.bytesPerSecond)).toBe('—');
    expect(secondsLeft(10 * MB, 0)).toBeNull();
    expect(secondsLeft(10 * MB, null)).toBeNull();
    expect(formatTimeLeft(secondsLeft(10 * MB, 0))).toBe('—');
    expect(formatTimeLeft(Infinity)).toBe('—');
    expect(formatSpeed(Infinity)).toBe('—');
    expect(formatSpeed(Number.NaN)).toBe('—');
  });
});

describe('speed and time left on screen', () => {
  // Decimal prefixes k = 10³, M = 10⁶, G = 10⁹ (SI Brochure, 9th ed., BIPM; IEC 80000-13 keeps Ki/Mi for powers of 1024).
  it('writes speeds with SI prefixes (powers of 1000), one decimal under 100', () => {
    expect(formatSpeed(38_200_000)).toBe('38.2 MB/s');
    expect(formatSpeed(312_000)).toBe('312 kB/s');
    expect(formatSpeed(256 * 1024)).toBe('262 kB/s'); // 256 KiB/s is 262.144 kB/s
    expect(formatSpeed(900)).toBe('900 B/s');
    expect(formatSpeed(999.7)).toBe('1.0 kB/s'); // not "1000 B/s"
    expect(formatSpeed(999_960)).toBe('1.0 MB/s'); // not "1000.0 kB/s"
    expect(formatSpeed(1.25e9)).toBe('1.3 GB/s');
  });

  // The rounding steps are our own presentation choice (no standard): whole seconds, then 5 s, 10 s, minutes.
  it('writes the time left in words, rounder the longer it is', () => {
    expect(formatTimeLeft(0.2)).toBe('about 1 s left');
    expect(formatTimeLeft(7)).toBe('about 7 s left');
    expect(formatTimeLeft(44)).toBe('about 45 s left');
    expect(formatTimeLeft(59)).toBe('about 1 min left');
    expect(formatTimeLeft(126)).toBe('about 2 min 10 s left');
    expect(formatTimeLeft(180)).toBe('about 3 min left');
    expect(formatTimeLeft(3599)).toBe('about 1 h left');
    expect(formatTimeLeft(3900)).toBe('about 1 h 5 min left');
    expect(formatTimeLeft(7200)).toBe('about 2 h left');
    expect(formatTimeLeft(-1)).toBe('—');
  });
});

describe('what a screen reader hears', () => {
  it('announces each quarter once, the highest one passed when a sample jumps', () => {
    expect(quarterPassed(0, 0.2)).toBeNull();
    expect(quarterPassed(0.2, 0.25)).toBe(25);
    expect(quarterPassed(0.25, 0.3)).toBeNull();
    expect(quarterPassed(0.3, 0.8)).toBe(75);
    expect(quarterPassed(0.8, 1)).toBeNull(); // the end is announced as "uploaded"
  });

  it('says the time left only when it is known', () => {
    expect(quarterAnnouncement('A007.mp4', 50, 40)).toBe('A007.mp4: 50 % sent, about 40 s left');
    expect(quarterAnnouncement('A007.mp4', 25, null)).toBe('A007.mp4: 25 % sent');
  });
});
