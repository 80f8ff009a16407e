import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ApprovalQueue } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const approvalsQueryOptions = (channelId: string, viewerZone: string) =>
  queryOptions({
    queryKey: ['publishing', 'approvals', channelId, viewerZone],
    queryFn: () => api<ApprovalQueue>('GET', `/api/channels/${channelId}/approvals?zone=${encodeURIComponent(viewerZone)}`),
  });

/** The producer's queue: episodes in Approval with slot, gear dates, footage, warnings and blockers. */
export const useApprovals = (channelId: string, viewerZone: string) => useQuery(approvalsQueryOptions(channelId, viewerZone));
