/**
 * The board's state as plain data: columns of card ids per stage, filters, and the optimistic move.
 * Pure so it is tested without a browser and shared by drag and drop, the "Move to…" control and
 * the optimistic update of the board query.
 */
import { STAGES, type Board, type BoardCard, type Stage } from '@midgray/shared';

/** Droppable id of a whole column (so empty columns accept drops); card ids are episode UUIDs. */
export const COLUMN_PREFIX = 'column:';
export const columnDropId = (stage: Stage) => `${COLUMN_PREFIX}${stage}`;
/** The stage of a column droppable id, or null for a card id. */
export function stageOfColumnId(id: string): Stage | null {
  if (!id.startsWith(COLUMN_PREFIX)) return null;
  const stage = id.slice(COLUMN_PREFIX.length) as Stage;
  return STAGES.includes(stage) ? stage : null;
}

/**
 * Cards first shown per column; "Show more" adds this many again. Every shown card registers with
 * the drag-and-drop context, whose cost grows faster than the card count, so 500-card boards show
 * 6 × 20 cards at first.
 */
export const COLUMN_PAGE = 20;

/** What the board filters on. */
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

/** Whether a card passes the filters; `me` is the signed-in user's id (for "mine"). */
export function matches(card: BoardCard, f: BoardFilters, me: string): boolean {
  const words = f.search.trim().toLocaleLowerCase().split(/\s+/).filter(Boolean);
  if (words.length) {
    const title = card.title.toLocaleLowerCase();
    if (!words.every((w) => title.includes(w))) return false;
  }
  if (f.gearId && !card.gearIds.includes(f.gearId)) return false;
  if (f.personId && card.hostId !== f.personId && card.editorId !== f.personId) return false;
  if (f.mine && card.hostId !== me && card.editorId !== me) return false;
  return true;
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
 * The board after `move`, as the server will store it: the card leaves its column, lands at
 * `toIndex` of the target column (clamped to its end), both columns are renumbered 0…n−1 and the
 * card's version goes up by one. Unknown cards leave the board unchanged.
 */
export function applyMove(board: Board, move: Move): Board {
  const card = board.episodes.find((e) => e.id === move.episodeId);
  if (!card) return board;
  const cols = columnsOf(board.episodes);
  cols[card.stage] = cols[card.stage].filter((c) => c.id !== card.id);
  const target = card.stage === move.toStage ? cols[card.stage] : cols[move.toStage].filter((c) => c.id !== card.id);
  const index = Math.max(0, Math.min(move.toIndex, target.length));
  target.splice(index, 0, { ...card, stage: move.toStage, version: card.version + 1 });
  cols[move.toStage] = target;
  const touched = new Set<Stage>([card.stage, move.toStage]);
  const episodes: BoardCard[] = [];
  for (const s of STAGES) {
    for (const [i, c] of cols[s].entries()) episodes.push(touched.has(s) && c.position !== i ? { ...c, position: i } : c);
  }
  return { ...board, episodes };
}

/**
 * The index in the FULL target column for a drop: before the card dropped on (`overId` a card id),
 * or at the end (`overId` the column itself). Filters may hide cards, so visible positions are not
 * column positions; the dragged card itself is not counted.
 */
export function dropIndex(board: Board, activeId: string, toStage: Stage, overId: string | null): number {
  const column = columnsOf(board.episodes)[toStage].filter((c) => c.id !== activeId);
  if (!overId || stageOfColumnId(overId)) return column.length;
  const at = column.findIndex((c) => c.id === overId);
  if (at < 0) return column.length;
  // Within the same column, dropping on a card below the start position lands after it (the list shifts up).
  const active = board.episodes.find((e) => e.id === activeId);
  const over = board.episodes.find((e) => e.id === overId);
  if (active && over && active.stage === toStage && over.position > active.position) return at + 1;
  return at;
}

/** "back" when the target stage is left of the card's stage, "forward" right of it, else "same". */
export function directionOf(from: Stage, to: Stage): 'back' | 'forward' | 'same' {
  const d = STAGES.indexOf(to) - STAGES.indexOf(from);
  return d < 0 ? 'back' : d > 0 ? 'forward' : 'same';
}
