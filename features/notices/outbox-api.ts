import { useQuery } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { outboxListResponseSchema, outboxMessageResponseSchema } from '@/features/notices/schema';

/**
 * Query keys of the admin's outbox. They start with 'notices' so that anything refreshing every notice
 * query (a notice issued or sent again) refreshes the outbox too.
 */
const outboxKeys = {
  all: ['notices', 'outbox'] as const,
  list: () => [...outboxKeys.all, 'list'] as const,
  message: (id: string) => [...outboxKeys.all, 'message', id] as const,
};

/** The server's answer when mail goes to a real SMTP server and there is no local mailbox to show. */
export const NO_LOCAL_MAILBOX = 'no_local_mailbox';

const enc = encodeURIComponent;

/** Every message the local mailbox holds, newest first. */
export function useOutboxQuery() {
  return useQuery({
    queryKey: outboxKeys.list(),
    queryFn: () => apiFetch('/api/admin/outbox', { schema: outboxListResponseSchema }),
  });
}

/** One message with its bodies; messages never change once received, so it is kept as fetched. */
export function useOutboxMessageQuery(id: string | null) {
  return useQuery({
    queryKey: outboxKeys.message(id ?? ''),
    queryFn: () => apiFetch(`/api/admin/outbox/${enc(id ?? '')}`, { schema: outboxMessageResponseSchema }),
    enabled: !!id,
    staleTime: Infinity,
  });
}

/** Where an attachment's bytes are fetched from (with the session token). */
export const outboxAttachmentPath = (messageId: string, index: number) =>
  `/api/admin/outbox/${enc(messageId)}/attachments/${index}`;
