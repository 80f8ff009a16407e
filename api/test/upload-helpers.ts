// Helpers for the upload tests: tus-js-client against a listening app, cookies from a signed-in
// client, clips made with ffmpeg's test sources, SHA-256 of files, waiting for background jobs.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { pipeline } from 'node:stream/promises';
import { promisify } from 'node:util';
import { CookieAccessInfo } from 'cookiejar';
import * as tus from 'tus-js-client';
import type { Client } from './helpers.ts';

const run = promisify(execFile);

/** The Cookie header of a signed-in test client (its session cookie). */
export function cookieOf(client: Client): string {
  return (client.agent as unknown as { jar: { getCookies: (a: unknown) => { toValueString: () => string } } }).jar.getCookies(CookieAccessInfo.All).toValueString();
}

/** Request headers of a signed-in browser: session cookie and CSRF token. */
export const authHeaders = (client: Client) => ({ Cookie: cookieOf(client), 'X-CSRF-Token': client.csrf });

/** Writes a clip with ffmpeg's lavfi test source: `source` like "testsrc=size=3840x2160:rate=24000/1001", `seconds` long. */
export async function makeClip(out: string, source: string, opts: { seconds?: number; frames?: number; args?: string[] } = {}) {
  const length = opts.frames ? ['-frames:v', String(opts.frames)] : ['-t', String(opts.seconds ?? 1)];
  await run('ffmpeg', ['-v', 'error', '-y', '-f', 'lavfi', '-i', source, ...length, ...(opts.args ?? []), out], { timeout: 120_000 });
  return out;
}

/** SHA-256 of a file, streamed, as hex. */
export async function sha256File(path: string): Promise<string> {
  const h = createHash('sha256');
  await pipeline(createReadStream(path), h);
  return h.digest('hex');
}

/** Polls `fn` until it returns a truthy value (or throws after `timeoutMs`). */
export async function waitFor<T>(fn: () => Promise<T | null | undefined | false>, timeoutMs = 30_000, what = 'condition'): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await fn();
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

export interface TusRun {
  upload: tus.Upload;
  /** Resolves with the upload URL on success, rejects with tus-js-client's error. */
  done: Promise<string>;
}

/** Starts a tus-js-client upload of the file at `path`. */
export function startTus(opts: {
  endpoint: string;
  path: string;
  headers: Record<string, string>;
  metadata: Record<string, string>;
  uploadUrl?: string;
  chunkSize?: number;
  onProgress?: (sent: number, total: number, upload: tus.Upload) => void;
}): TusRun {
  let upload!: tus.Upload;
  const done = new Promise<string>((resolve, reject) => {
    upload = new tus.Upload(createReadStream(opts.path), {
      endpoint: opts.endpoint,
      uploadUrl: opts.uploadUrl ?? null,
      headers: opts.headers,
      metadata: opts.metadata,
      chunkSize: opts.chunkSize ?? Infinity,
      retryDelays: null,
      removeFingerprintOnSuccess: true,
      onProgress: (sent, total) => opts.onProgress?.(sent, total, upload),
      onSuccess: () => resolve(upload.url!),
      onError: (err) => reject(err),
    });
    upload.start();
  });
  return { upload, done };
}

/** The status code and body of a tus-js-client error (DetailedError). */
export function tusErrorOf(err: unknown): { status: number | undefined; body: string } {
  const e = err as { originalResponse?: { getStatus: () => number; getBody: () => string } };
  return { status: e.originalResponse?.getStatus(), body: e.originalResponse?.getBody() ?? String(err) };
}
