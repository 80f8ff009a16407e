import { useSortable } from '@dnd-kit/sortable';
import { CSS } from '@dnd-kit/utilities';
import { memo, useMemo, type PointerEventHandler } from 'react';
import { Link } from 'react-router-dom';
import { episodeDateFlags, MOVE_INDEX_END, nextKeyDate, STAGE_LABELS, type BoardCard, type BoardGear, type BoardPerson, type Stage } from '@midgray/shared';
import { Avatar } from '../../../components/ui/avatar.tsx';
import { ChecklistIcon, FootageIcon, GripIcon } from '../../../components/ui/icons.tsx';
import { DateFlags, KeyDateLine } from './key-date.tsx';
import { StageOptions } from './stage-options.tsx';

/** What every card needs besides itself; one object per board render so memoised cards compare cheaply. */
export interface CardContext {
  gearById: Map<string, BoardGear>;
  peopleById: Map<string, BoardPerson>;
  /** ISO instant, refreshed once a minute. */
  now: string;
  timeZone: string;
  /** Asks for a move (the board opens the reason dialog for back moves). */
  onMoveTo: (card: BoardCard, toStage: Stage, toIndex: number) => void;
}

const MAX_GEAR = 3;

/** The "Move to…" list: the next stage, every earlier stage (back moves say they need a reason) and the column's top. */
const MoveToSelect = memo(function MoveToSelect({ card, onMoveTo }: { card: BoardCard; onMoveTo: CardContext['onMoveTo'] }) {
  return (
    <select
      aria-label={`Move "${card.title}" to`}
      className="w-full min-w-0 rounded border border-line-strong bg-card px-1.5 py-1 text-xs text-ink-soft"
      onPointerDown={(e) => e.stopPropagation()}
      value=""
      onChange={(e) => {
        const value = e.target.value;
        e.target.value = '';
        if (value === 'top') onMoveTo(card, card.stage, 0);
        else if (value) onMoveTo(card, value as Stage, MOVE_INDEX_END);
      }}
    >
      <option value="">Move to…</option>
      {card.position > 0 && <option value="top">Top of {STAGE_LABELS[card.stage]}</option>}
      <StageOptions stage={card.stage} />
    </select>
  );
});

/**
 * The card's contents, memoised apart from the drag wrapper: dnd-kit re-renders every sortable when
 * any of them registers or moves, and this keeps those re-renders to the thin wrapper.
 */
const CardBody = memo(function CardBody({ card, ctx }: { card: BoardCard; ctx: CardContext }) {
  const gear = useMemo(() => card.gearIds.map((id) => ctx.gearById.get(id)).filter((g): g is BoardGear => !!g), [card.gearIds, ctx.gearById]);
  const host = card.hostId ? ctx.peopleById.get(card.hostId) : undefined;
  const editor = card.editorId ? ctx.peopleById.get(card.editorId) : undefined;
  const dates = useMemo(() => ({ stage: card.stage, shootDate: card.shootDate, gear, slots: card.slots }), [card.stage, card.shootDate, card.slots, gear]);
  const next = useMemo(() => nextKeyDate(dates, ctx.now, ctx.timeZone), [dates, ctx.now, ctx.timeZone]);
  const flags = useMemo(() => episodeDateFlags(dates), [dates]);
  return (
    <>
      <Link to={`/episodes/${card.id}`} className="block text-sm leading-snug font-semibold text-ink hover:text-accent-strong hover:underline">
        {card.title}
      </Link>
      {gear.length > 0 && (
        <ul className="flex flex-wrap gap-1" aria-label="Gear">
          {gear.slice(0, MAX_GEAR).map((g) => (
            <li key={g.id} className="max-w-full truncate rounded bg-paper px-1.5 py-0.5 text-[11px] text-ink-soft">
              {g.name}
            </li>
          ))}
          {gear.length > MAX_GEAR && <li className="px-1 py-0.5 text-[11px] text-ink-muted">+{gear.length - MAX_GEAR} more</li>}
        </ul>
      )}
      {next && <KeyDateLine date={next} compact />}
      <DateFlags flags={flags} compact />
      <div className="flex items-center justify-between gap-2">
        <div className="flex items-center -space-x-1" aria-label="People">
          {host ? <Avatar name={host.name} role="host" size="sm" /> : null}
          {editor ? <Avatar name={editor.name} role="editor" size="sm" /> : null}
          {!host && !editor && <span className="text-[11px] text-ink-muted">Nobody assigned</span>}
        </div>
        <div className="flex items-center gap-2 text-[11px] text-ink-muted">
          {card.footageCount !== null && (
            <span className="inline-flex items-center gap-0.5" title="Footage files">
              <FootageIcon width={13} height={13} />
              {card.footageCount}
              <span className="sr-only"> footage {card.footageCount === 1 ? 'file' : 'files'}</span>
            </span>
          )}
          {card.openSpecLines !== null && (
            <span className={`inline-flex items-center gap-0.5 ${card.openSpecLines > 0 ? 'text-ink-soft' : ''}`} title="Open spec-sheet lines">
              <ChecklistIcon width={13} height={13} />
              {card.openSpecLines}
              <span className="sr-only"> open spec-sheet {card.openSpecLines === 1 ? 'line' : 'lines'}</span>
            </span>
          )}
        </div>
      </div>
    </>
  );
});

/**
 * One episode on the board. Drag it with the mouse anywhere on the card, or with the keyboard from
 * its handle (Space to pick up, arrows to move, Space to drop); "Move to…" does the same in one step.
 * Memoised: a card re-renders only when its own data or the shared context changes.
 */
export const EpisodeCard = memo(function EpisodeCard({ card, ctx }: { card: BoardCard; ctx: CardContext }) {
  const { attributes, listeners, setNodeRef, setActivatorNodeRef, transform, transition, isDragging } = useSortable({ id: card.id, data: { stage: card.stage } });
  return (
    <li
      ref={setNodeRef}
      style={{ transform: CSS.Translate.toString(transform), transition }}
      className={`flex flex-col gap-2 rounded-md border border-line bg-card p-2.5 shadow-sm ${isDragging ? 'opacity-40' : ''}`}
      onPointerDown={listeners?.onPointerDown as PointerEventHandler<HTMLLIElement> | undefined}
      data-episode-id={card.id}
      aria-label={card.title}
    >
      <div className="flex items-start gap-1">
        <button
          ref={setActivatorNodeRef}
          type="button"
          className="-ml-1 shrink-0 cursor-grab rounded p-0.5 text-ink-muted hover:bg-paper hover:text-ink active:cursor-grabbing"
          {...attributes}
          {...listeners}
          aria-label={`Drag "${card.title}"`}
          aria-describedby={attributes['aria-describedby']}
        >
          <GripIcon />
        </button>
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <CardBody card={card} ctx={ctx} />
        </div>
      </div>
      <MoveToSelect card={card} onMoveTo={ctx.onMoveTo} />
    </li>
  );
});

/** The card as it follows the pointer while dragging (no drag wiring). */
export function CardPreview({ card, ctx }: { card: BoardCard; ctx: CardContext }) {
  return (
    <div className="flex w-[15rem] rotate-1 flex-col gap-2 rounded-md border border-line-strong bg-card p-2.5 shadow-xl">
      <CardBody card={card} ctx={ctx} />
    </div>
  );
}
