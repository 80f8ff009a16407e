import { describe, expect, it } from 'vitest';
import type { Board, BoardCard, Stage } from '@midgray/shared';
import { applyMove, columnDropId, columnsOf, directionOf, dropIndex, matches, NO_FILTERS, stageOfColumnId } from './board-model.ts';

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
const ME = id(900);
const OTHER = id(901);

function card(n: number, stage: Stage, position: number, over: Partial<BoardCard> = {}): BoardCard {
  return { id: id(n), title: `Card ${n}`, stage, position, version: 1, hostId: null, editorId: null, gearIds: [], shootDate: null, targetPublishWeek: null, footageCount: 0, openSpecLines: 0, slots: [], ...over };
}

function board(cards: BoardCard[]): Board {
  return { channelId: id(999), timeZone: 'UTC', readAt: '2026-05-01T00:00:00.000Z', episodes: cards, gear: [], people: [] };
}

const layout = (b: Board) => Object.fromEntries(Object.entries(columnsOf(b.episodes)).filter(([, l]) => l.length).map(([s, l]) => [s, l.map((c) => `${c.title}@${c.position}`)]));

describe('applyMove', () => {
  const b = board([card(1, 'plan', 0), card(2, 'plan', 1), card(3, 'plan', 2), card(4, 'shoot', 0)]);

  it('moves a card into another column at an index and renumbers both columns', () => {
    const after = applyMove(b, { episodeId: id(2), toStage: 'shoot', toIndex: 0, version: 1 });
    expect(layout(after)).toEqual({ plan: ['Card 1@0', 'Card 3@1'], shoot: ['Card 2@0', 'Card 4@1'] });
    expect(after.episodes.find((c) => c.id === id(2))!.version).toBe(2);
  });

  it('reorders within a column and clamps an index past the end', () => {
    expect(layout(applyMove(b, { episodeId: id(1), toStage: 'plan', toIndex: 99, version: 1 }))).toEqual({ plan: ['Card 2@0', 'Card 3@1', 'Card 1@2'], shoot: ['Card 4@0'] });
    expect(layout(applyMove(b, { episodeId: id(3), toStage: 'plan', toIndex: 0, version: 1 }))).toEqual({ plan: ['Card 3@0', 'Card 1@1', 'Card 2@2'], shoot: ['Card 4@0'] });
  });

  it('keeps untouched cards as the same objects (memoised cards do not re-render)', () => {
    const withGrade = board([...b.episodes, card(5, 'grade', 0)]);
    const after = applyMove(withGrade, { episodeId: id(3), toStage: 'shoot', toIndex: 1, version: 1 });
    expect(after.episodes.find((c) => c.id === id(5))).toBe(withGrade.episodes[4]);
    expect(after.episodes.find((c) => c.id === id(1))).toBe(withGrade.episodes[0]);
  });

  it('leaves the board alone for an unknown card', () => {
    expect(applyMove(b, { episodeId: id(77), toStage: 'live', toIndex: 0, version: 1 })).toBe(b);
  });
});

describe('dropIndex', () => {
  const b = board([card(1, 'plan', 0), card(2, 'plan', 1), card(3, 'plan', 2), card(4, 'plan', 3), card(5, 'shoot', 0)]);

  it('dropping on a card of another column lands before it; on the column itself, at the end', () => {
    expect(dropIndex(b, id(5), 'plan', id(2))).toBe(1);
    expect(dropIndex(b, id(5), 'plan', columnDropId('plan'))).toBe(4);
    expect(dropIndex(b, id(1), 'shoot', null)).toBe(1);
  });

  it('within a column it matches moving the card into the other card’s place', () => {
    // A onto C: [B, C, A, D]; D onto B: [A, D, B, C].
    expect(layout(applyMove(b, { episodeId: id(1), toStage: 'plan', toIndex: dropIndex(b, id(1), 'plan', id(3)), version: 1 })).plan).toEqual(['Card 2@0', 'Card 3@1', 'Card 1@2', 'Card 4@3']);
    expect(layout(applyMove(b, { episodeId: id(4), toStage: 'plan', toIndex: dropIndex(b, id(4), 'plan', id(2)), version: 1 })).plan).toEqual(['Card 1@0', 'Card 4@1', 'Card 2@2', 'Card 3@3']);
  });
});

describe('filters', () => {
  const c = card(1, 'plan', 0, { title: 'K9 Cine: noise across the ISO range', hostId: ME, editorId: OTHER, gearIds: [id(50)] });

  it('search matches every word of the title, in any case and order', () => {
    expect(matches(c, { ...NO_FILTERS, search: 'iso k9' }, ME)).toBe(true);
    expect(matches(c, { ...NO_FILTERS, search: 'latitude' }, ME)).toBe(false);
  });

  it('gear, person and "mine" narrow the cards', () => {
    expect(matches(c, { ...NO_FILTERS, gearId: id(50) }, ME)).toBe(true);
    expect(matches(c, { ...NO_FILTERS, gearId: id(51) }, ME)).toBe(false);
    expect(matches(c, { ...NO_FILTERS, personId: OTHER }, ME)).toBe(true);
    expect(matches(c, { ...NO_FILTERS, mine: true }, ME)).toBe(true);
    expect(matches(c, { ...NO_FILTERS, mine: true }, id(902))).toBe(false);
  });
});

describe('ids and directions', () => {
  it('tells column ids from card ids', () => {
    expect(stageOfColumnId(columnDropId('grade'))).toBe('grade');
    expect(stageOfColumnId(id(1))).toBeNull();
    expect(stageOfColumnId('column:editing')).toBeNull();
  });

  it('knows back from forward', () => {
    expect(directionOf('grade', 'shoot')).toBe('back');
    expect(directionOf('plan', 'shoot')).toBe('forward');
    expect(directionOf('live', 'live')).toBe('same');
  });
});
