// The built web app's initial JavaScript: the module script and the modulepreload links of
// index.html, each gzipped (zlib, level 9 as a static server would), summed. Target: under 250 KB.
// Usage: node web/scripts/bundle-size.mjs [distDir]   (default web/dist)
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { gzipSync } from 'node:zlib';

const dist = resolve(process.argv[2] ?? 'web/dist');
const html = readFileSync(join(dist, 'index.html'), 'utf8');
const srcs = new Set();
for (const m of html.matchAll(/<script\b[^>]*type="module"[^>]*src="([^"]+)"/g)) srcs.add(m[1]);
for (const m of html.matchAll(/<link\b[^>]*rel="modulepreload"[^>]*href="([^"]+)"/g)) srcs.add(m[1]);
if (!srcs.size) throw new Error(`no module script in ${dist}/index.html`);
let raw = 0;
let gz = 0;
for (const src of srcs) {
  const bytes = readFileSync(join(dist, src.replace(/^\//, '')));
  const z = gzipSync(bytes, { level: 9 }).length;
  raw += bytes.length;
  gz += z;
  console.log(`${src}\t${(bytes.length / 1000).toFixed(1)} kB\t${(z / 1000).toFixed(1)} kB gz`);
}
const limit = 250_000;
console.log(`initial JavaScript: ${srcs.size} file(s), ${(raw / 1000).toFixed(1)} kB, ${(gz / 1000).toFixed(1)} kB gzipped (target < ${limit / 1000} kB)`);
if (process.argv.includes('--check') && gz >= limit) process.exit(1);
