// How footage numbers read in the table: bytes with binary prefixes (IEC 80000-13), durations as m:ss
// (upload speeds, in SI units, are in ../upload-rate.ts).

/** Returns "1.4 GiB", "820 MiB", "12 KiB", "512 bytes". */
export function formatBytes(bytes: number): string {
  const units = ['bytes', 'KiB', 'MiB', 'GiB', 'TiB'];
  let n = bytes;
  let i = 0;
  while (n >= 1024 && i < units.length - 1) {
    n /= 1024;
    i++;
  }
  return i === 0 ? `${n} bytes` : `${n.toFixed(n >= 100 ? 0 : 1)} ${units[i]}`;
}

/** Returns a duration in seconds as "1:02:03", "2:05" or "0:02"; "—" when unknown. */
export function formatDuration(seconds: number | null | undefined): string {
  if (seconds == null) return '—';
  const s = Math.round(seconds);
  const h = Math.floor(s / 3600);
  const m = Math.floor((s % 3600) / 60);
  const sec = String(s % 60).padStart(2, '0');
  return h ? `${h}:${String(m).padStart(2, '0')}:${sec}` : `${m}:${sec}`;
}
