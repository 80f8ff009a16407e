// Hashes a file with SHA-256 in a worker (hash-wasm streams it in 8 MiB slices), so the page
// stays responsive while multi-GB files are read. Messages: {file} in; progress and result out.
import { createSHA256 } from 'hash-wasm';

const SLICE = 8 * 1024 * 1024;

self.onmessage = async (e: MessageEvent<{ file: File }>) => {
  const { file } = e.data;
  try {
    const hasher = await createSHA256();
    hasher.init();
    let lastReport = 0;
    for (let at = 0; at < file.size; at += SLICE) {
      hasher.update(new Uint8Array(await file.slice(at, Math.min(at + SLICE, file.size)).arrayBuffer()));
      const now = Date.now();
      if (now - lastReport > 250) {
        lastReport = now;
        self.postMessage({ type: 'progress', bytes: Math.min(at + SLICE, file.size) });
      }
    }
    self.postMessage({ type: 'done', sha256: hasher.digest('hex') });
  } catch (err) {
    self.postMessage({ type: 'error', message: err instanceof Error ? err.message : String(err) });
  }
};
