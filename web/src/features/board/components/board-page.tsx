import {
  closestCorners,
  DndContext,
  DragOverlay,
  KeyboardSensor,
  PointerSensor,
  pointerWithin,
  rectIntersection,
  useSensor,
  useSensors,
  type Announcements,
  type CollisionDetection,
  type DragEndEvent,
  type DragStartEvent,
  type ScreenReaderInstructions,
  type UniqueIdentifier,
} from '@dnd-kit/core';
import { sortableKeyboardCoordinates } from '@dnd-kit/sortable';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { canRole, EMPTY_EPISODE_FORM, episodeFormToInput, STAGE_LABELS, STAGES, type Board, type BoardCard, type Stage } from '@midgray/shared';
import { Button } from '../../../components/ui/button.tsx';
import { Dialog } from '../../../components/ui/dialog.tsx';
import { ErrorNote, Loading, PageHeader } from '../../../components/ui/page.tsx';
import { useToast } from '../../../components/ui/toast.tsx';
import { ApiError } from '../../../lib/api-client.ts';
import { useDebouncedValue } from '../../../lib/use-debounced-value.ts';
import { useChannel } from '../../channels/current-channel.tsx';
import { boardQueryOptions, useBoard, useMoveEpisode } from '../api/board.ts';
import { useCreateEpisode } from '../api/episodes.ts';
import { boardQueryOf, COLUMN_PAGE, columnsOf, directionOf, dropIndex, NO_FILTERS, stageOfColumnId, type BoardFilters, type Move } from '../board-model.ts';
import { BoardColumn } from './board-column.tsx';
import { BoardFilterBar } from './board-filters.tsx';
import { CardPreview, type CardContext } from './episode-card.tsx';
import { EpisodeFormFields } from './episode-form.tsx';
import { ReasonDialog, type PendingBackMove } from './reason-dialog.tsx';

/** The current instant, refreshed every minute (card dates say "today", "in 2 days"). */
function useNow(): string {
  const [now, setNow] = useState(() => new Date().toISOString());
  useEffect(() => {
    const t = setInterval(() => setNow(new Date().toISOString()), 60_000);
    return () => clearInterval(t);
  }, []);
  return now;
}

/**
 * Which droppable the card is over. The pointer decides when there is one (a card under it wins
 * over its column, so drops land between cards; empty space in a column means its end); the
 * keyboard has no pointer, so the dragged card's rectangle decides, then the nearest corners.
 */
const collisionDetection: CollisionDetection = (args) => {
  let hits = pointerWithin(args);
  if (hits.length === 0) hits = rectIntersection(args);
  if (hits.length === 0) return closestCorners(args);
  const card = hits.find((h) => stageOfColumnId(String(h.id)) === null);
  return [card ?? hits[0]];
};

/** Where a drop target is, in words ("in Shoot, before “K7 re-test”" / "at the end of Shoot"). */
function describeSpot(board: Board, activeId: UniqueIdentifier, overId: UniqueIdentifier | undefined): string {
  if (overId === undefined) return 'outside the columns';
  const column = stageOfColumnId(String(overId));
  if (column) return `at the end of ${STAGE_LABELS[column]}`;
  const over = board.episodes.find((e) => e.id === overId);
  if (!over) return 'outside the columns';
  if (over.id === activeId) return `in ${STAGE_LABELS[over.stage]}, where it was`;
  return `in ${STAGE_LABELS[over.stage]}, at “${over.title}”`;
}

const screenReaderInstructions: ScreenReaderInstructions = {
  draggable:
    'To move this card, press Space or Enter on its handle, then use the arrow keys: up and down within a column, left and right to other columns. Press Space or Enter to drop it, or Escape to put it back. The "Move to" list on each card does the same in one step.',
};

/** The board: one column per stage, filters, drag and drop, "Move to…", and new episodes. */
export function BoardPage() {
  const channel = useChannel();
  const toast = useToast();
  const now = useNow();
  const [filters, setFilters] = useState<BoardFilters>(NO_FILTERS);
  // Cards asked for per column beyond the first page ("Show more"); a new filter starts over.
  const [show, setShow] = useState<Partial<Record<Stage, number>>>({});
  const changeFilters = useCallback((f: BoardFilters) => {
    setFilters(f);
    setShow({});
  }, []);
  // The server filters: typing asks it once the search has rested for a moment.
  const search = useDebouncedValue(filters.search, 250);
  const query = useMemo(() => boardQueryOf({ ...filters, search }, show), [filters, search, show]);
  const board = useBoard(channel.id, query);
  const move = useMoveEpisode(channel.id, boardQueryOptions(channel.id, query).queryKey);
  const showMore = useCallback((stage: Stage) => setShow((s) => ({ ...s, [stage]: (s[stage] ?? COLUMN_PAGE) + COLUMN_PAGE })), []);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [pendingBack, setPendingBack] = useState<PendingBackMove | null>(null);
  const [creating, setCreating] = useState(false);
  const data = board.data;
  const dataRef = useRef(data);
  const justPicked = useRef<UniqueIdentifier | null>(null);
  dataRef.current = data;

  const sensors = useSensors(useSensor(PointerSensor, { activationConstraint: { distance: 6 } }), useSensor(KeyboardSensor, { coordinateGetter: sortableKeyboardCoordinates }));

  /** Sends a move; on refusal the optimistic card has already snapped back (useMoveEpisode). */
  const send = useCallback(
    (card: BoardCard, m: Move) => {
      move.mutate(m, {
        onSuccess: () => {
          if (card.stage !== m.toStage) toast({ tone: 'success', title: `“${card.title}” moved to ${STAGE_LABELS[m.toStage]}` });
        },
        onError: (err) => {
          if (err instanceof ApiError && err.code === 'stage_rule_failed') {
            const missing = (err.details as { missing?: string[] } | undefined)?.missing ?? [err.message];
            toast({ tone: 'error', title: `“${card.title}” stays in ${STAGE_LABELS[card.stage]}: it cannot move to ${STAGE_LABELS[m.toStage]} yet`, lines: missing });
          } else if (err instanceof ApiError && err.code === 'stale_version') {
            toast({ tone: 'error', title: 'Someone else changed this card meanwhile', lines: [err.message] });
          } else toast({ tone: 'error', title: err instanceof Error ? err.message : 'The move did not go through' });
        },
      });
    },
    [move.mutate, toast],
  );

  /** A move asked for by a drop or "Move to…": back moves ask for a reason first. */
  const requestMove = useCallback(
    (card: BoardCard, toStage: Stage, toIndex: number) => {
      const current = dataRef.current;
      if (!current) return;
      const columnLength = current.columns[toStage].total - (card.stage === toStage ? 1 : 0);
      const index = Math.min(toIndex, columnLength);
      if (toStage === card.stage && index === card.position) return;
      const m: Move = { episodeId: card.id, toStage, toIndex: index, version: card.version };
      if (directionOf(card.stage, toStage) === 'back') {
        setPendingBack({ title: card.title, from: card.stage, to: toStage, confirm: (reason) => send(card, { ...m, reason }) });
      } else send(card, m);
    },
    [send],
  );

  const gearById = useMemo(() => new Map((data?.gear ?? []).map((g) => [g.id, g])), [data?.gear]);
  const peopleById = useMemo(() => new Map((data?.people ?? []).map((p) => [p.userId, p])), [data?.people]);
  const ctx: CardContext = useMemo(() => ({ gearById, peopleById, now, timeZone: data?.timeZone ?? channel.timeZone, onMoveTo: requestMove }), [gearById, peopleById, now, data?.timeZone, channel.timeZone, requestMove]);
  const shown = useMemo(() => columnsOf(data?.episodes ?? []), [data?.episodes]);

  const cardOf = (id: UniqueIdentifier | undefined) => (id === undefined ? undefined : data?.episodes.find((e) => e.id === id));

  const announcements: Announcements = {
    onDragStart: ({ active }) => {
      justPicked.current = active.id;
      const card = cardOf(active.id);
      if (!card) return;
      return `Picked up “${card.title}” from ${STAGE_LABELS[card.stage]}, place ${card.position + 1} of ${data?.columns[card.stage].total ?? card.position + 1}.`;
    },
    onDragOver: ({ active, over }) => {
      // Right after pick-up the card is over its own place: keep the pick-up message audible.
      if (justPicked.current === active.id && over?.id === active.id) return undefined;
      justPicked.current = null;
      return data ? `“${cardOf(active.id)?.title ?? 'The card'}” is now ${describeSpot(data, active.id, over?.id)}.` : undefined;
    },
    onDragEnd: ({ active, over }) => (data ? `Dropped “${cardOf(active.id)?.title ?? 'the card'}” ${describeSpot(data, active.id, over?.id)}. Checking the move with the server.` : undefined),
    onDragCancel: ({ active }) => {
      const card = cardOf(active.id);
      return card ? `Move cancelled: “${card.title}” stays in ${STAGE_LABELS[card.stage]}.` : undefined;
    },
  };

  const onDragStart = (e: DragStartEvent) => setActiveId(String(e.active.id));
  const onDragEnd = ({ active, over }: DragEndEvent) => {
    setActiveId(null);
    const card = cardOf(active.id);
    if (!card || !over || !data) return;
    const toStage = stageOfColumnId(String(over.id)) ?? cardOf(over.id)?.stage;
    if (!toStage) return;
    requestMove(card, toStage, dropIndex(data, card.id, toStage, String(over.id)));
  };

  const canCreate = canRole(channel.role, 'episode.create');
  const active = cardOf(activeId ?? undefined);
  const total = data ? STAGES.reduce((n, s) => n + data.columns[s].total, 0) : 0;
  const matching = data ? STAGES.reduce((n, s) => n + data.columns[s].matching, 0) : 0;
  const refreshing = board.isPlaceholderData;

  return (
    <div>
      <PageHeader
        title="Board"
        description={`Every episode of ${channel.name}, one column per stage. Drag a card, or use its “Move to…” list; the server checks the stage rules.`}
        actions={
          <>
            <Link to="/archive" className="inline-flex min-h-9 items-center rounded-md border border-line-strong bg-card px-3 py-1.5 text-sm font-semibold hover:bg-paper">
              Archive
            </Link>
            {canCreate && (
              <Button variant="primary" onClick={() => setCreating(true)}>
                New episode
              </Button>
            )}
          </>
        }
      />
      {board.isLoading && <Loading what="Loading the board" />}
      {board.error && <ErrorNote error={board.error} />}
      {data && (
        <>
          <BoardFilterBar filters={filters} onChange={changeFilters} gear={data.gear} people={data.people} matching={matching} total={total} busy={refreshing} />
          <DndContext sensors={sensors} collisionDetection={collisionDetection} onDragStart={onDragStart} onDragEnd={onDragEnd} onDragCancel={() => setActiveId(null)} accessibility={{ announcements, screenReaderInstructions }}>
            <div className="relative -mx-4 snap-x snap-mandatory scroll-px-4 overflow-x-auto px-4 pb-3 sm:snap-none" role="region" aria-label="Board columns" tabIndex={-1}>
              <div className="grid auto-cols-[82%] grid-flow-col gap-3 sm:auto-cols-[minmax(13.25rem,1fr)]">
                {STAGES.map((stage) => (
                  <BoardColumn key={stage} stage={stage} cards={shown[stage]} count={data.columns[stage]} ctx={ctx} onShowMore={showMore} loadingMore={refreshing && !!show[stage]} />
                ))}
              </div>
            </div>
            <DragOverlay dropAnimation={null}>{active ? <CardPreview card={active} ctx={ctx} /> : null}</DragOverlay>
          </DndContext>
          <ReasonDialog pending={pendingBack} onClose={() => setPendingBack(null)} />
          <CreateEpisodeDialog open={creating} onClose={() => setCreating(false)} board={data} />
        </>
      )}
    </div>
  );
}

function CreateEpisodeDialog({ open, onClose, board }: { open: boolean; onClose: () => void; board: Board }) {
  const channel = useChannel();
  const create = useCreateEpisode(channel.id);
  const toast = useToast();
  return (
    <Dialog open={open} onClose={onClose} title="New episode" description="It starts at the bottom of Plan." wide>
      <EpisodeFormFields
        initial={EMPTY_EPISODE_FORM}
        gear={board.gear}
        people={board.people}
        submitLabel="Create episode"
        pending={create.isPending}
        onCancel={onClose}
        onSubmit={async (values) => {
          const ep = await create.mutateAsync(episodeFormToInput(values));
          toast({ tone: 'success', title: `“${ep.title}” is on the board in Plan` });
          onClose();
        }}
      />
    </Dialog>
  );
}
