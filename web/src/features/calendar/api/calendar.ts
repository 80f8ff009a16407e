import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CalendarEvent } from '@midgray/shared';
import { api } from '../../../lib/api-client.ts';

export const calendarQueryOptions = (channelId: string, from: string, to: string) =>
  queryOptions({
    queryKey: ['calendar', channelId, from, to],
    queryFn: () => api<CalendarEvent[]>('GET', `/api/channels/${channelId}/calendar?from=${from}&to=${to}`),
    placeholderData: keepPreviousData,
  });

/** Publish slots, embargo lifts, due-back dates and shoot days between two dates (inclusive). */
export const useCalendar = (channelId: string, from: string, to: string) => useQuery(calendarQueryOptions(channelId, from, to));
