import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.ts';

/** A message the local SMTP fake captured. */
export interface CapturedMail {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  hasHtml: boolean;
}

export const mailboxQueryOptions = () => queryOptions({ queryKey: ['dev', 'mailbox'], queryFn: () => api<CapturedMail[]>('GET', '/api/dev/mailbox'), refetchInterval: 5000 });
export const useMailbox = () => useQuery(mailboxQueryOptions());
