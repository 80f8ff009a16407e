import { useDroppable } from '@dnd-kit/core';
import { SortableContext, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { memo } from 'react';
import { STAGE_LABELS, type BoardCard, type BoardColumnCount, type Stage } from '@midgray/shared';
import { COLUMN_PAGE, columnDropId } from '../board-model.ts';
import { EpisodeCard, type CardContext } from './episode-card.tsx';

/**
 * One stage of the board: its own droppable (so an empty column accepts a drop) around a sortable
 * list of the cards the server sent (the first COLUMN_PAGE that pass the filters), and a "Show
 * more" button that asks for the next ones, so 500-card boards stay light.
 */
export const BoardColumn = memo(function BoardColumn({
  stage,
  cards,
  count,
  ctx,
  onShowMore,
  loadingMore,
}: {
  stage: Stage;
  cards: BoardCard[];
  count: BoardColumnCount;
  ctx: CardContext;
  onShowMore: (stage: Stage) => void;
  loadingMore: boolean;
}) {
  const { setNodeRef, isOver } = useDroppable({ id: columnDropId(stage), data: { stage } });
  const headingId = `column-${stage}-heading`;
  const hidden = Math.max(0, count.matching - cards.length);
  return (
    <section aria-labelledby={headingId} className="flex min-w-0 snap-start flex-col rounded-lg bg-black/[0.04]" data-stage={stage}>
      <header className="flex items-baseline justify-between gap-2 px-3 pt-2.5 pb-2">
        <h2 id={headingId} className="text-sm font-bold tracking-wide uppercase">
          {STAGE_LABELS[stage]}
        </h2>
        <span className="text-xs text-ink-muted">
          {count.matching === count.total ? count.total : `${count.matching} of ${count.total}`}
          <span className="sr-only"> {count.total === 1 ? 'episode' : 'episodes'}</span>
        </span>
      </header>
      <SortableContext id={columnDropId(stage)} items={cards.map((c) => c.id)} strategy={verticalListSortingStrategy}>
        <ol ref={setNodeRef} className={`flex min-h-24 flex-1 flex-col gap-2 rounded-b-lg px-2 pb-2 transition-colors ${isOver ? 'bg-accent-soft outline-2 outline-accent/60 outline-dashed' : ''}`} aria-label={`${STAGE_LABELS[stage]} cards`}>
          {cards.map((card) => (
            <EpisodeCard key={card.id} card={card} ctx={ctx} />
          ))}
          {cards.length === 0 && <li className="px-1 py-4 text-center text-xs text-ink-muted">{count.total === 0 ? 'No episodes here' : 'None match the filters'}</li>}
        </ol>
      </SortableContext>
      {hidden > 0 && (
        <button
          type="button"
          className="mx-2 mb-2 rounded-md border border-line-strong bg-card px-2 py-1.5 text-xs font-semibold text-ink-soft hover:bg-paper disabled:opacity-60"
          disabled={loadingMore}
          onClick={() => onShowMore(stage)}
        >
          {loadingMore ? 'Loading more…' : `Show ${Math.min(COLUMN_PAGE, hidden)} more of ${hidden} hidden`}
        </button>
      )}
    </section>
  );
});
