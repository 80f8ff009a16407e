// The board of a channel and moving cards on it. The move is optimistic: the card lands at once,
// the server decides, and a refused or stale move rolls back to the board as it was.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Board, MoveResult } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';
import { applyMove, type Move } from '../board-model.ts';

/** Every card, gear item and person of the board. Key ['board', channelId] (others invalidate ['board']). */
export const boardQueryOptions = (channelId: string) =>
  queryOptions({ queryKey: ['board', channelId], queryFn: () => api<Board>('GET', `/api/channels/${channelId}/board`) });

export const useBoard = (channelId: string) => useQuery(boardQueryOptions(channelId));

/** Moves a card (stage and index) with an optimistic update and rollback. */
export function useMoveEpisode(channelId: string) {
  const qc = useQueryClient();
  const { queryKey } = boardQueryOptions(channelId);
  return useMutation({
    mutationFn: ({ episodeId, ...body }: Move) => api<MoveResult>('POST', `/api/episodes/${episodeId}/move`, body),
    // 1. Stop refetches that would overwrite the optimistic board, 2. keep the board as it was,
    // 3. show the move at once. The snapshot goes to onError through the context.
    onMutate: async (move) => {
      await qc.cancelQueries({ queryKey });
      const previous = qc.getQueryData(queryKey);
      if (previous) qc.setQueryData(queryKey, applyMove(previous, move));
      return { previous };
    },
    // 4. Refused (422), stale (409) or failed: put the board back exactly as it was.
    onError: (_err, _move, context) => {
      if (context?.previous) qc.setQueryData(queryKey, context.previous);
    },
    // 5. Either way, read the server's board again (a 409 means someone else moved cards too).
    onSettled: (_data, _err, move) => {
      void qc.invalidateQueries({ queryKey });
      void qc.invalidateQueries({ queryKey: ['episodes', 'detail', move.episodeId] });
    },
  });
}
