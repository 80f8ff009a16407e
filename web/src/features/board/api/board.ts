// The board of a channel and moving cards on it. The move is optimistic: the card lands at once,
// the server decides, and a refused or stale move rolls back to the board as it was.
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient, type QueryKey } from '@tanstack/react-query';
import { boardSearchParams, type Board, type BoardQueryInput, type MoveResult } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';
import { applyMove, type Move } from '../board-model.ts';

/**
 * The first cards of each column that pass the filters, the column counts, gear and people.
 * Key ['board', channelId, query] (others invalidate ['board']); the default query is the plain board.
 */
export const boardQueryOptions = (channelId: string, query: BoardQueryInput = {}) => {
  const search = boardSearchParams(query);
  return queryOptions({ queryKey: ['board', channelId, search], queryFn: () => api<Board>('GET', `/api/channels/${channelId}/board${search}`) });
};

/**
 * The board for `query`. While a new filter or "Show more" loads, the board of the same channel
 * stays on screen (`isPlaceholderData` tells it is the previous one).
 */
export const useBoard = (channelId: string, query: BoardQueryInput = {}) =>
  useQuery({ ...boardQueryOptions(channelId, query), placeholderData: (previous, previousQuery) => (previousQuery?.queryKey[1] === channelId ? previous : undefined) });

/** Moves a card (stage and index) on the board read with `queryKey`, with an optimistic update and rollback. */
export function useMoveEpisode(channelId: string, queryKey: QueryKey) {
  const qc = useQueryClient();
  const everyBoard = ['board', channelId];
  return useMutation({
    mutationFn: ({ episodeId, ...body }: Move) => api<MoveResult>('POST', `/api/episodes/${episodeId}/move`, body),
    // 1. Stop refetches that would overwrite the optimistic board, 2. keep the board as it was,
    // 3. show the move at once. The snapshot goes to onError through the context.
    onMutate: async (move) => {
      await qc.cancelQueries({ queryKey: everyBoard });
      const previous = qc.getQueryData<Board>(queryKey);
      if (previous) qc.setQueryData<Board>(queryKey, applyMove(previous, move));
      return { previous };
    },
    // 4. Refused (422), stale (409) or failed: put the board back exactly as it was.
    onError: (_err, _move, context) => {
      if (context?.previous) qc.setQueryData(queryKey, context.previous);
    },
    // 5. Either way, read the server's board again (a 409 means someone else moved cards too).
    onSettled: (_data, _err, move) => {
      void qc.invalidateQueries({ queryKey: everyBoard });
      void qc.invalidateQueries({ queryKey: ['episodes', 'detail', move.episodeId] });
    },
  });
}
