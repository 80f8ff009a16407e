import { describe, expect, it } from 'vitest';
import { FreshCoalescer } from './fresh-coalescer.ts';

/** A load function whose calls are recorded and resolved by hand. */
function controlledLoads() {
  const calls: { resolve: (v: string) => void; reject: (e: Error) => void; startedAfter: number }[] = [];
  let clock = 0;
  const tick = () => ++clock;
  const load = () =>
    new Promise<string>((resolve, reject) => {
      calls.push({ resolve, reject, startedAfter: clock });
    });
  return { calls, load, tick };
}

describe('FreshCoalescer', () => {
  it('a lone request runs exactly one read', async () => {
    const c = new FreshCoalescer<string>();
    const { calls, load } = controlledLoads();
    const p = c.get('board', load);
    expect(calls).toHaveLength(1);
    calls[0].resolve('v1');
    await expect(p).resolves.toBe('v1');
    // The next request after it finished starts a new read.
    const q = c.get('board', load);
    expect(calls).toHaveLength(2);
    calls[1].resolve('v2');
    await expect(q).resolves.toBe('v2');
  });

  it('requests arriving during a read share the NEXT read, never the one already running', async () => {
    const c = new FreshCoalescer<string>();
    const { calls, load, tick } = controlledLoads();
    const first = c.get('board', load);
    tick(); // a write commits here, after the first read started
    const late = [c.get('board', load), c.get('board', load), c.get('board', load)];
    expect(calls).toHaveLength(1); // nobody starts a second read while the first runs
    calls[0].resolve('before the write');
    await expect(first).resolves.toBe('before the write');
    await Promise.resolve();
    await Promise.resolve();
    expect(calls).toHaveLength(2);
    expect(calls[1].startedAfter).toBe(1); // the shared read began after the write
    calls[1].resolve('after the write');
    await expect(Promise.all(late)).resolves.toEqual(['after the write', 'after the write', 'after the write']);
  });

  it('keys do not share, and a failed read fails only its own callers', async () => {
    const c = new FreshCoalescer<string>();
    const { calls, load } = controlledLoads();
    const a = c.get('channel-a', load);
    const b = c.get('channel-b', load);
    expect(calls).toHaveLength(2);
    const waiting = c.get('channel-a', load);
    calls[0].reject(new Error('database went away'));
    await expect(a).rejects.toThrow('database went away');
    await Promise.resolve();
    await Promise.resolve();
    expect(calls).toHaveLength(3);
    calls[2].resolve('a again');
    calls[1].resolve('b');
    await expect(waiting).resolves.toBe('a again');
    await expect(b).resolves.toBe('b');
  });
});
