// How exposure numbers read in tables, warnings and spec-sheet lines.

const MINUS = '\u2212';
const THIRDS = ['', '⅓', '⅔'];

/** Returns a stop count as people write it: "+1⅓", "−3", "0"; values off the third-stop grid get two decimals ("+0.27"). */
export function formatStops(stops: number): string {
  const thirds = Math.round(stops * 3);
  if (Math.abs(stops * 3 - thirds) > 1e-6) {
    const text = Math.abs(stops).toFixed(2);
    return text === '0.00' ? '0' : `${stops < 0 ? MINUS : '+'}${text}`;
  }
  if (thirds === 0) return '0';
  const whole = Math.floor(Math.abs(thirds) / 3);
  const part = THIRDS[Math.abs(thirds) % 3];
  return `${thirds < 0 ? MINUS : '+'}${whole === 0 ? '' : whole}${part}`;
}

/** Returns "stop" or "stops" to follow a stop count. */
export function stopWord(stops: number): string {
  return Math.abs(stops) <= 1 + 1e-9 ? 'stop' : 'stops';
}

/** Returns a frame rate label in fps: 24 → "24 fps", 24000/1001 → "23.976 fps", 30000/1001 → "29.97 fps". */
export function formatFps(fps: number): string {
  return `${Number(fps.toFixed(3))} fps`;
}

/** Returns an exposure time label: "1/48 s" below one second (nearest whole denominator), else "2 s" or "1.3 s". */
export function formatSeconds(seconds: number): string {
  if (seconds < 1) {
    const denominator = 1 / seconds;
    return denominator < 10 && Math.abs(denominator - Math.round(denominator)) > 0.05
      ? `${Number(seconds.toFixed(2))} s`
      : `1/${Math.round(denominator)} s`;
  }
  return `${Number(seconds.toFixed(1))} s`;
}

/** Returns a shutter angle label in degrees: 180 → "180°", 172.8 → "172.8°". */
export function formatAngle(angleDeg: number): string {
  return `${Number(angleDeg.toFixed(1))}°`;
}

/** Returns an f-number label: 5.6 → "f/5.6". */
export function formatFNumber(fNumber: number): string {
  return `f/${Number(fNumber.toFixed(2))}`;
}

/** Returns an ND optical density label with one or two decimals: 0.9 → "0.9", 0 → "0.0", 0.15 → "0.15". */
export function formatDensity(opticalDensity: number): string {
  const rounded = Number(opticalDensity.toFixed(2));
  return rounded.toFixed(Number.isInteger(Math.round(rounded * 100) / 10) ? 1 : 2);
}

/** Returns a positive magnitude with at most one decimal for warnings: 1.333 → "1.3", 2.0 → "2". */
export function formatMagnitude(value: number): string {
  return String(Number(Math.abs(value).toFixed(1)));
}
