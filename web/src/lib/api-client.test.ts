import { afterEach, describe, expect, it, vi } from 'vitest';
import { getCsrfToken } from './api-client.ts';

describe('getCsrfToken', () => {
  afterEach(() => vi.unstubAllGlobals());

  it('shares one fetch between callers that ask at the same moment, and keeps the token', async () => {
    let made = 0;
    const fetchMock = vi.fn(async () => new Response(JSON.stringify({ token: `token-${++made}` }), { headers: { 'content-type': 'application/json' } }));
    vi.stubGlobal('fetch', fetchMock);
    // Three uploads start at once: one token for all of them.
    const tokens = await Promise.all([getCsrfToken(), getCsrfToken(), getCsrfToken()]);
    expect(tokens).toEqual(['token-1', 'token-1', 'token-1']);
    expect(await getCsrfToken()).toBe('token-1');
    expect(fetchMock).toHaveBeenCalledTimes(1);
    // After a refused write the caller asks for a fresh one.
    expect(await getCsrfToken(true)).toBe('token-2');
    expect(fetchMock).toHaveBeenCalledTimes(2);
  });
});
