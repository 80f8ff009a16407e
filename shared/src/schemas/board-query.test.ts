import { describe, expect, it } from 'vitest';
import { BOARD_COLUMN_PAGE, BoardQuerySchema, boardSearchParams } from './episodes.ts';

const parse = (search: string) => BoardQuerySchema.parse(Object.fromEntries(new URLSearchParams(search)));

describe('the board query', () => {
  it('defaults to the plain board: no filters, the first page of every column', () => {
    expect(parse('')).toEqual({ q: '', mine: false, limit: BOARD_COLUMN_PAGE, show: {} });
    expect(boardSearchParams({})).toBe('');
    expect(boardSearchParams({ q: '  ', mine: false, limit: BOARD_COLUMN_PAGE, show: {} })).toBe('');
  });

  it('keeps search words in order, collapses spaces and drops words past the eighth', () => {
    expect(parse('q=' + encodeURIComponent('  K9   noise ')).q).toBe('K9 noise');
    expect(parse('q=' + encodeURIComponent('a b c d e f g h i j')).q).toBe('a b c d e f g h');
  });

  it('writes one canonical query string that parses back to the same query', () => {
    const query = { q: 'k9 iso', gearId: '00000000-0000-4000-8000-000000000050', personId: undefined, mine: true, limit: 5, show: { live: 60, grade: 40 } };
    const search = boardSearchParams(query);
    // Columns in stage order whatever order they were given in.
    expect(search).toBe('?q=k9+iso&gearId=00000000-0000-4000-8000-000000000050&mine=true&limit=5&show=grade%3A40%2Clive%3A60');
    expect(parse(search.slice(1))).toEqual({ q: 'k9 iso', gearId: query.gearId, mine: true, limit: 5, show: { grade: 40, live: 60 } });
  });

  it('refuses unknown stages, zero and huge counts with the form to use', () => {
    for (const bad of ['show=review:40', 'show=plan:0', 'show=plan:1001', 'show=plan', 'limit=0', 'limit=2.5', 'mine=1', 'extra=1']) {
      expect(BoardQuerySchema.safeParse(Object.fromEntries(new URLSearchParams(bad))).success, bad).toBe(false);
    }
    const r = BoardQuerySchema.safeParse({ show: 'review:40' });
    expect(r.success ? '' : r.error.issues[0].message).toMatch(/show=stage:count.*“review:40”/);
  });
});
