/**
 * Readout benchmark (issue 6, "Figures"): a 3840×2160 16-bit PNG made with synthChartFrame
 * (invented data), timed as
 *   1. sharp merely decoding it, against decode + noise readout;
 *   2. sharp decoding two such frames, against decode both + recovery readout (with map PNG).
 * Target: readout ≤ 2× decode, i.e. (decode + readout) / decode ≤ 2. Prints medians of several
 * runs, the ratios, and peak RSS / heap. Run: `npx tsx api/bench/readout.bench.ts [runs]`.
 */
import sharp from 'sharp';
import {
  decodeFrame,
  noiseReadout,
  recoveryReadout,
  synthChartFrame,
  type Frame,
} from '../src/modules/readouts/measure/index.ts';

// No libvips operation cache: every decode in the timings really decodes.
sharp.cache(false);

const WIDTH = 3840;
const HEIGHT = 2160;
const RUNS = Math.max(1, Number(process.argv[2] ?? 7));
/** Issue 6: (decode + readout) / decode ≤ 2 for both readouts. */
const TARGET_RATIO = 2;

let peakRss = 0;
let peakHeap = 0;
function sampleMemory(): void {
  const m = process.memoryUsage();
  peakRss = Math.max(peakRss, m.rss);
  peakHeap = Math.max(peakHeap, m.heapUsed + m.arrayBuffers);
}
const memoryTimer = setInterval(sampleMemory, 5);

async function encodePng(frame: Frame): Promise<Buffer> {
  return sharp(frame.data, { raw: { width: frame.width, height: frame.height, channels: 3 } })
    .toColourspace('rgb16')
    .png({ compressionLevel: 6 })
    .toBuffer();
}

/** Sharp decoding to raw 16-bit pixels and nothing else: the yardstick. */
async function decodeOnly(png: Buffer): Promise<number> {
  const { info } = await sharp(png).toColourspace('rgb16').raw({ depth: 'ushort' }).toBuffer({ resolveWithObject: true });
  return info.size;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

async function time(fn: () => Promise<unknown>): Promise<number> {
  const start = performance.now();
  await fn();
  sampleMemory();
  return performance.now() - start;
}

const mib = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(0)} MiB`;
const ms = (value: number) => `${value.toFixed(0)} ms`;

async function main(): Promise<void> {
  console.log(`Readout benchmark: ${WIDTH}×${HEIGHT} 16-bit PNG, invented synthetic chart, ${RUNS} runs (median)`);
  console.log(`node ${process.version}, sharp ${sharp.versions.sharp}, libvips ${sharp.versions.vips}`);

  // Reference at base ISO and a frame shot 2 stops over and pulled back (highlights clipped).
  const reference = synthChartFrame({ width: WIDTH, height: HEIGHT, noiseSigma: 0.004, chromaNoiseSigma: 0.002, seed: 1 });
  const recovered = synthChartFrame({
    width: WIDTH,
    height: HEIGHT,
    noiseSigma: 0.004,
    chromaNoiseSigma: 0.002,
    exposureOffsetStops: 2,
    seed: 2,
  });
  // Measure noise where a host would draw the region: the middle of the L* 50 grey patch.
  const grey = reference.patches.find((p) => p.row === 3 && p.col === 3)!.rect;
  const region = {
    x: grey.x + Math.round(grey.w * 0.2),
    y: grey.y + Math.round(grey.h * 0.2),
    w: Math.round(grey.w * 0.6),
    h: Math.round(grey.h * 0.6),
  };
  const referencePng = await encodePng(reference.frame);
  const recoveredPng = await encodePng(recovered.frame);
  console.log(`PNG sizes: ${mib(referencePng.length)} and ${mib(recoveredPng.length)}`);
  sampleMemory();
  const setupRss = process.memoryUsage().rss;

  // Warm-up: JIT, look-up tables, libvips caches.
  await decodeOnly(referencePng);
  noiseReadout(await decodeFrame(referencePng), region);
  await recoveryReadout(await decodeFrame(recoveredPng), await decodeFrame(referencePng), { region });

  const decode1: number[] = [];
  const decodeNoise: number[] = [];
  const noiseOnly: number[] = [];
  const decode2: number[] = [];
  const decodeRecovery: number[] = [];
  const recoveryOnly: number[] = [];
  let lastNoise: ReturnType<typeof noiseReadout> | null = null;
  let lastRecovery: Awaited<ReturnType<typeof recoveryReadout>> | null = null;

  for (let run = 0; run < RUNS; run++) {
    decode1.push(await time(() => decodeOnly(referencePng)));
    decodeNoise.push(
      await time(async () => {
        const frame = await decodeFrame(referencePng);
        const start = performance.now();
        lastNoise = noiseReadout(frame, region);
        noiseOnly.push(performance.now() - start);
      }),
    );
    decode2.push(await time(() => Promise.all([decodeOnly(recoveredPng), decodeOnly(referencePng)])));
    decodeRecovery.push(
      await time(async () => {
        const [rec, ref] = await Promise.all([decodeFrame(recoveredPng), decodeFrame(referencePng)]);
        const start = performance.now();
        lastRecovery = await recoveryReadout(rec, ref, { region });
        recoveryOnly.push(performance.now() - start);
      }),
    );
  }
  clearInterval(memoryTimer);
  sampleMemory();

  const d1 = median(decode1), dn = median(decodeNoise), n = median(noiseOnly);
  const d2 = median(decode2), dr = median(decodeRecovery), r = median(recoveryOnly);
  console.log('');
  console.log('noise readout (1 frame)');
  console.log(`  sharp decode only            ${ms(d1)}`);
  console.log(`  decode + noise readout       ${ms(dn)}   (readout alone ${ms(n)})`);
  console.log(`  ratio (decode+readout)/decode ${(dn / d1).toFixed(2)}×   readout/decode ${(n / d1).toFixed(2)}×   target ≤ 2×`);
  console.log('recovery readout (2 frames, decoded concurrently)');
  console.log(`  sharp decode only            ${ms(d2)}`);
  console.log(`  decode + recovery readout    ${ms(dr)}   (readout alone ${ms(r)}, stride ${lastRecovery!.stride}, ${lastRecovery!.sampleCount} samples)`);
  console.log(`  ratio (decode+readout)/decode ${(dr / d2).toFixed(2)}×   readout/decode ${(r / d2).toFixed(2)}×   target ≤ 2×`);
  console.log(
    `peak RSS ${mib(peakRss)} (${mib(setupRss)} after building the two test frames and PNGs), ` +
      `peak heap + array buffers ${mib(peakHeap)} (sampled every 5 ms)`,
  );
  const missed = [dn / d1, dr / d2].filter((ratio) => ratio > TARGET_RATIO).length;
  console.log(missed ? `target missed: ${missed} of 2 readouts took more than ${TARGET_RATIO}× the decode alone` : `target met: both readouts within ${TARGET_RATIO}× the decode alone`);
  // npm run bench reports a missed target as a failed bench.
  if (missed) process.exitCode = 1;
  console.log('');
  console.log(
    `sanity: noise SNR ${lastNoise!.snrDb?.toFixed(2)} dB on the grey patch (${region.w}×${region.h} px); recovery mean ΔE00 ${lastRecovery!.meanDeltaE.toFixed(2)}, ` +
      `p95 ${lastRecovery!.p95DeltaE.toFixed(2)}, max ${lastRecovery!.maxDeltaE.toFixed(2)}, noise ×${lastRecovery!.noiseRatio?.toFixed(2)}, map ${lastRecovery!.mapWidth}×${lastRecovery!.mapHeight}`,
  );
}

await main();
