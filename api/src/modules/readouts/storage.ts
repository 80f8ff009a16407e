// Files of the readouts in the storage folder (the same folder and key style as uploads:
// `uploads/<id>` there, `readouts/<readout id>/<name>` here). Keys are built by the server only;
// `storagePath` still refuses any key that would leave the folder.
import { mkdir, writeFile } from 'node:fs/promises';
import { dirname, isAbsolute, relative, resolve } from 'node:path';

const KEY_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._/-]{0,300}$/;

/** Absolute path of `key` inside `storageDir`; throws on a key that is absolute, has `..` or leaves the folder. */
export function storagePath(storageDir: string, key: string): string {
  if (!KEY_PATTERN.test(key) || key.split('/').some((part) => part === '..' || part === '.' || part === '')) {
    throw new Error(`not a storage key: ${JSON.stringify(key)}`);
  }
  const root = resolve(storageDir);
  const path = resolve(root, key);
  const rel = relative(root, path);
  if (!rel || rel.startsWith('..') || isAbsolute(rel)) throw new Error(`storage key leaves the storage folder: ${key}`);
  return path;
}

/** Storage key of one of a readout's images. */
export function readoutImageKey(readoutId: string, name: 'difference-map.png' | 'frame.jpg' | 'reference.jpg'): string {
  if (!/^[0-9a-f-]{36}$/.test(readoutId)) throw new Error('bad readout id');
  return `readouts/${readoutId}/${name}`;
}

/** Writes `bytes` under `key` (folders made as needed); returns the key. */
export async function writeStored(storageDir: string, key: string, bytes: Buffer): Promise<string> {
  const path = storagePath(storageDir, key);
  await mkdir(dirname(path), { recursive: true });
  await writeFile(path, bytes);
  return key;
}
