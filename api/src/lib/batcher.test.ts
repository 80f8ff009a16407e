import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { Batcher } from './batcher.ts';

describe('Batcher', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it('sends the items of one key that arrive within the window as one batch, each key on its own', async () => {
    const sent: [string, string[]][] = [];
    const b = new Batcher<string>(60_000, async (key, items) => void sent.push([key, items]));
    await b.add('ep1', 'A001.mov');
    await vi.advanceTimersByTimeAsync(30_000);
    await b.add('ep1', 'A002.mov');
    await b.add('ep2', 'B001.mov');
    expect(sent).toEqual([]);
    await vi.advanceTimersByTimeAsync(30_000);
    expect(sent).toEqual([['ep1', ['A001.mov', 'A002.mov']]]);
    await vi.advanceTimersByTimeAsync(30_000);
    expect(sent).toEqual([['ep1', ['A001.mov', 'A002.mov']], ['ep2', ['B001.mov']]]);
    // A later item opens a new window.
    await b.add('ep1', 'A003.mov');
    await vi.advanceTimersByTimeAsync(60_000);
    expect(sent.at(-1)).toEqual(['ep1', ['A003.mov']]);
  });

  it('with a 0 window sends at once; flush sends what waits; a failed delivery is reported, not thrown', async () => {
    const now: string[][] = [];
    await new Batcher<string>(0, async (_k, items) => void now.push(items)).add('ep', 'x');
    expect(now).toEqual([['x']]);
    const sent: string[][] = [];
    const b = new Batcher<string>(60_000, async (_k, items) => void sent.push(items));
    await b.add('ep', 'y');
    await b.flush();
    expect(sent).toEqual([['y']]);
    const errors: unknown[] = [];
    const failing = new Batcher<string>(0, async () => Promise.reject(new Error('smtp down')), (e) => errors.push(e));
    await failing.add('ep', 'z');
    expect(errors.map((e) => (e as Error).message)).toEqual(['smtp down']);
  });
});
