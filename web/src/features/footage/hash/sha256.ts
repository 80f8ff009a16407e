/** Computes a file's SHA-256 (hex) in a web worker; reports bytes read so far. */
export function sha256OfFile(file: File, onProgress?: (bytes: number) => void): { promise: Promise<string>; cancel: () => void } {
  const worker = new Worker(new URL('./sha256.worker.ts', import.meta.url), { type: 'module' });
  const promise = new Promise<string>((resolve, reject) => {
    worker.onmessage = (e: MessageEvent<{ type: 'progress'; bytes: number } | { type: 'done'; sha256: string } | { type: 'error'; message: string }>) => {
      const m = e.data;
      if (m.type === 'progress') onProgress?.(m.bytes);
      else {
        worker.terminate();
        if (m.type === 'done') resolve(m.sha256);
        else reject(new Error(m.message));
      }
    };
    worker.onerror = (e) => {
      worker.terminate();
      reject(new Error(e.message || 'The checksum worker failed'));
    };
    worker.postMessage({ file });
  });
  return { promise, cancel: () => worker.terminate() };
}
