import { useDroppable } from '@dnd-kit/core';
import { SortableContext, verticalListSortingStrategy } from '@dnd-kit/sortable';
import { memo, useState } from 'react';
import { STAGE_LABELS, type BoardCard, type Stage } from '@midgray/shared';
import { COLUMN_PAGE, columnDropId } from '../board-model.ts';
import { EpisodeCard, type CardContext } from './episode-card.tsx';

/**
 * One stage of the board: its own droppable (so an empty column accepts a drop) around a sortable
 * list. Shows the first COLUMN_PAGE cards and a "Show more" button, so 500 cards stay light.
 */
export const BoardColumn = memo(function BoardColumn({ stage, cards, total, ctx }: { stage: Stage; cards: BoardCard[]; total: number; ctx: CardContext }) {
  const [limit, setLimit] = useState(COLUMN_PAGE);
  const { setNodeRef, isOver } = useDroppable({ id: columnDropId(stage), data: { stage } });
  const shown = cards.length > limit ? cards.slice(0, limit) : cards;
  const headingId = `column-${stage}-heading`;
  return (
    <section aria-labelledby={headingId} className="flex min-w-0 snap-start flex-col rounded-lg bg-black/[0.04]" data-stage={stage}>
      <header className="flex items-baseline justify-between gap-2 px-3 pt-2.5 pb-2">
        <h2 id={headingId} className="text-sm font-bold tracking-wide uppercase">
          {STAGE_LABELS[stage]}
        </h2>
        <span className="text-xs text-ink-muted">
          {cards.length === total ? total : `${cards.length} of ${total}`}
          <span className="sr-only"> {total === 1 ? 'episode' : 'episodes'}</span>
        </span>
      </header>
      <SortableContext id={columnDropId(stage)} items={shown.map((c) => c.id)} strategy={verticalListSortingStrategy}>
        <ol ref={setNodeRef} className={`flex min-h-24 flex-1 flex-col gap-2 rounded-b-lg px-2 pb-2 transition-colors ${isOver ? 'bg-accent-soft outline-2 outline-accent/60 outline-dashed' : ''}`} aria-label={`${STAGE_LABELS[stage]} cards`}>
          {shown.map((card) => (
            <EpisodeCard key={card.id} card={card} ctx={ctx} />
          ))}
          {cards.length === 0 && <li className="px-1 py-4 text-center text-xs text-ink-muted">{total === 0 ? 'No episodes here' : 'None match the filters'}</li>}
        </ol>
      </SortableContext>
      {cards.length > limit && (
        <button type="button" className="mx-2 mb-2 rounded-md border border-line-strong bg-card px-2 py-1.5 text-xs font-semibold text-ink-soft hover:bg-paper" onClick={() => setLimit((l) => l + COLUMN_PAGE)}>
          Show {Math.min(COLUMN_PAGE, cards.length - limit)} more of {cards.length - limit} hidden
        </button>
      )}
    </section>
  );
});
