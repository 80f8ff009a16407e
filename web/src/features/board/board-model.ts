/**
 * The board's state as plain data: columns of card ids per stage, filters, and the optimistic move.
 * Pure so it is tested without a browser and shared by drag and drop, the "Move to…" control and
 * the optimistic update of the board query.
 */
import { BOARD_COLUMN_PAGE, STAGES, type Board, type BoardCard, type BoardQueryInput, type Stage } from '@midgray/shared';

/** Droppable id of a whole column (so empty columns accept drops); card ids are episode UUIDs. */
export const COLUMN_PREFIX = 'column:';
export const columnDropId = (stage: Stage) => `${COLUMN_PREFIX}${stage}`;
/** The stage of a column droppable id, or null for a card id. */
export function stageOfColumnId(id: string): Stage | null {
  if (!id.startsWith(COLUMN_PREFIX)) return null;
  const stage = id.slice(COLUMN_PREFIX.length) as Stage;
  return STAGES.includes(stage) ? stage : null;
}

/** Cards first shown per column; "Show more" asks the server for this many more. */
export const COLUMN_PAGE = BOARD_COLUMN_PAGE;

/** What the board filters on (the server applies them). */
export interface BoardFilters {
  search: string;
  gearId: string;
  personId: string;
  mine: boolean;
}

export const NO_FILTERS: BoardFilters = { search: '', gearId: '', personId: '', mine: false };

export function hasFilters(f: BoardFilters): boolean {
  return f.search.trim() !== '' || f.gearId !== '' || f.personId !== '' || f.mine;
}

/** The board request for these filters and per-column card counts ("Show more"). */
export function boardQueryOf(f: BoardFilters, show: Partial<Record<Stage, number>>): BoardQueryInput {
  return { q: f.search.trim(), gearId: f.gearId || undefined, personId: f.personId || undefined, mine: f.mine, show };
}

/** Cards per stage in board order (the API sends them sorted by stage, then position). */
export function columnsOf(cards: readonly BoardCard[]): Record<Stage, BoardCard[]> {
  const out = Object.fromEntries(STAGES.map((s) => [s, [] as BoardCard[]])) as Record<Stage, BoardCard[]>;
  for (const c of cards) out[c.stage].push(c);
  for (const s of STAGES) out[s].sort((a, b) => a.position - b.position);
  return out;
}

/** A move as the API takes it. */
export interface Move {
  episodeId: string;
  toStage: Stage;
  toIndex: number;
  version: number;
  reason?: string;
}

/**
 * The board after `move`, as the server will store it: the card leaves its column (the cards
 * below move up one place), lands at `toIndex` of the target column (clamped to the column's end;
 * the cards from there move down one), column counts follow and the card's version goes up by
 * one. Positions are places in the whole column, so this holds when only its first cards are
 * loaded or filters hide some. Untouched cards stay the same objects. Unknown cards: no change.
 */
export function applyMove(board: Board, move: Move): Board {
  const card = board.episodes.find((e) => e.id === move.episodeId);
  if (!card) return board;
  const from = card.stage;
  const to = move.toStage;
  const targetLength = board.columns[to].total - (from === to ? 1 : 0);
  const index = Math.max(0, Math.min(move.toIndex, targetLength));
  const episodes = board.episodes.map((c) => {
    if (c.id === card.id) return { ...c, stage: to, position: index, version: c.version + 1 };
    let position = c.position;
    if (c.stage === from && position > card.position) position--;
    if (c.stage === to && position >= index) position++;
    return position === c.position ? c : { ...c, position };
  });
  const order = (c: BoardCard) => STAGES.indexOf(c.stage);
  episodes.sort((a, b) => order(a) - order(b) || a.position - b.position);
  const columns = { ...board.columns };
  if (from !== to) {
    columns[from] = { total: columns[from].total - 1, matching: columns[from].matching - 1 };
    columns[to] = { total: columns[to].total + 1, matching: columns[to].matching + 1 };
  }
  return { ...board, episodes, columns };
}

/**
 * The index in the WHOLE target column for a drop: the place of the card dropped on (so the
 * dragged card lands before it, or after it when it came from above in the same column), or the
 * column's end (`overId` the column itself). Cards carry their place in the whole column, so
 * hidden and not-yet-loaded cards are counted right.
 */
export function dropIndex(board: Board, activeId: string, toStage: Stage, overId: string | null): number {
  const active = board.episodes.find((e) => e.id === activeId);
  const end = board.columns[toStage].total - (active?.stage === toStage ? 1 : 0);
  if (!overId || stageOfColumnId(overId)) return end;
  const over = board.episodes.find((e) => e.id === overId);
  if (!over || over.stage !== toStage) return end;
  return Math.min(over.position, end);
}

/** "back" when the target stage is left of the card's stage, "forward" right of it, else "same". */
export function directionOf(from: Stage, to: Stage): 'back' | 'forward' | 'same' {
  const d = STAGES.indexOf(to) - STAGES.indexOf(from);
  return d < 0 ? 'back' : d > 0 ? 'forward' : 'same';
}
