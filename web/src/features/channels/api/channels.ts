import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Channel, CreateChannelInput, UpdateChannelInput } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';
import { meQueryOptions } from '../../auth/api/me.ts';

/** Creates a channel (the caller becomes its admin). */
export const createChannel = (input: CreateChannelInput) => api<Channel>('POST', '/api/channels', input);
/** Updates name, zone or settings; needs the version the form was loaded with. */
export const updateChannel = (channelId: string, input: UpdateChannelInput) => api<Channel>('PATCH', `/api/channels/${channelId}`, input);

export function useCreateChannel() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createChannel, onSuccess: () => qc.invalidateQueries({ queryKey: meQueryOptions().queryKey }) });
}

export function useUpdateChannel(channelId: string) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: UpdateChannelInput) => updateChannel(channelId, input), onSuccess: () => qc.invalidateQueries({ queryKey: meQueryOptions().queryKey }) });
}
