import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailboxMessageView } from '../../../../shared/api/responses';
import { apiRequest } from '../../../lib/api-client';
import { ApiRequestError } from '../../../lib/api-error';

/** How often the local mailbox page asks for new mail. */
export const MAILBOX_REFRESH_MS = 3000;

/** Mail the server sent to its local SMTP server, newest first. Answers 404 when real SMTP is configured. */
export async function getMailbox(): Promise<MailboxMessageView[]> {
  const { messages } = await apiRequest<{ messages: MailboxMessageView[] }>('/dev/mailbox');
  return [...messages].sort((a, b) => Date.parse(b.receivedAt) - Date.parse(a.receivedAt));
}

/** True when the server has no local mailbox (it sends real e-mail). */
export function isMailboxOff(error: unknown): boolean {
  return error instanceof ApiRequestError && error.status === 404;
}

export const getMailboxQueryOptions = () =>
  queryOptions({
    queryKey: ['dev', 'mailbox'],
    queryFn: getMailbox,
    staleTime: 0,
    // Keeps polling, also through a failed refresh, but not once the server says there is no mailbox.
    refetchInterval: (query) => (isMailboxOff(query.state.error) ? false : MAILBOX_REFRESH_MS),
  });

export function useMailbox() {
  return useQuery(getMailboxQueryOptions());
}
