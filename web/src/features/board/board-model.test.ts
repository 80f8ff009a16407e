import { describe, expect, it } from 'vitest';
import { STAGES, type Board, type BoardCard, type Stage } from '@midgray/shared';
import { applyMove, boardQueryOf, columnDropId, columnsOf, directionOf, dropIndex, NO_FILTERS, stageOfColumnId } from './board-model.ts';

const id = (n: number) => `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;

function card(n: number, stage: Stage, position: number, over: Partial<BoardCard> = {}): BoardCard {
  return { id: id(n), title: `Card ${n}`, stage, position, version: 1, hostId: null, editorId: null, gearIds: [], shootDate: null, targetPublishWeek: null, footageCount: 0, openSpecLines: 0, slots: [], ...over };
}

/** A board of these loaded cards; `totals` gives a column more cards than are loaded (not sent yet or filtered out). */
function board(cards: BoardCard[], totals: Partial<Record<Stage, number>> = {}): Board {
  const columns = Object.fromEntries(
    STAGES.map((s) => {
      const loaded = cards.filter((c) => c.stage === s).length;
      return [s, { total: totals[s] ?? loaded, matching: totals[s] ?? loaded }];
    }),
  ) as Board['columns'];
  return { channelId: id(999), timeZone: 'UTC', readAt: '2026-05-01T00:00:00.000Z', episodes: cards, columns, gear: [], people: [] };
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

describe('only the first cards of a long column loaded', () => {
  // Plan holds 50 episodes, of which the first 3 are loaded; Shoot holds 30, of which 2 are loaded.
  const b = board([card(1, 'plan', 0), card(2, 'plan', 1), card(3, 'plan', 2), card(4, 'shoot', 0), card(5, 'shoot', 1)], { plan: 50, shoot: 30 });

  it('a move to the end of a column goes to the whole column’s end, and the counts follow', () => {
    const after = applyMove(b, { episodeId: id(2), toStage: 'shoot', toIndex: dropIndex(b, id(2), 'shoot', columnDropId('shoot')), version: 1 });
    expect(layout(after)).toEqual({ plan: ['Card 1@0', 'Card 3@1'], shoot: ['Card 4@0', 'Card 5@1', 'Card 2@30'] });
    expect(after.columns.plan).toEqual({ total: 49, matching: 49 });
    expect(after.columns.shoot).toEqual({ total: 31, matching: 31 });
  });

  it('within a column the end is the place after the last of all its cards', () => {
    expect(dropIndex(b, id(1), 'plan', columnDropId('plan'))).toBe(49);
    expect(layout(applyMove(b, { episodeId: id(1), toStage: 'plan', toIndex: 49, version: 1 })).plan).toEqual(['Card 2@0', 'Card 3@1', 'Card 1@49']);
  });

  it('filters hide cards between the loaded ones: a drop lands at the place of the card dropped on', () => {
    // Loaded (matching) cards sit at places 4 and 9 of Grade's 12.
    const f = board([card(6, 'grade', 4), card(7, 'grade', 9), card(8, 'shoot', 0)], { grade: 12, shoot: 1 });
    expect(dropIndex(f, id(8), 'grade', id(7))).toBe(9);
    const after = applyMove(f, { episodeId: id(8), toStage: 'grade', toIndex: 9, version: 1 });
    expect(layout(after).grade).toEqual(['Card 6@4', 'Card 8@9', 'Card 7@10']);
    // Moving the card at 4 below the one at 9 (same column): it takes place 9, that one moves up to 8.
    expect(layout(applyMove(f, { episodeId: id(6), toStage: 'grade', toIndex: dropIndex(f, id(6), 'grade', id(7)), version: 1 })).grade).toEqual(['Card 7@8', 'Card 6@9']);
  });
});

describe('the board request', () => {
  it('sends the filters the server applies, and nothing for empty ones', () => {
    expect(boardQueryOf(NO_FILTERS, {})).toEqual({ q: '', gearId: undefined, personId: undefined, mine: false, show: {} });
    expect(boardQueryOf({ search: '  k9 iso ', gearId: id(50), personId: '', mine: true }, { grade: 40 })).toEqual({ q: 'k9 iso', gearId: id(50), personId: undefined, mine: true, show: { grade: 40 } });
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
