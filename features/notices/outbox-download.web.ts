import { API_BASE, saveBlob } from '@/features/api';
import { ApiRequestError, apiErrorSchema } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';
import { outboxAttachmentPath } from '@/features/notices/outbox-api';

/**
 * Saves one attachment of an outbox message. A plain link cannot carry the session token, so the bytes
 * are fetched with it and handed to the browser as a download from an object URL.
 */
export async function downloadOutboxAttachment(
  messageId: string,
  index: number,
  fileName: string,
): Promise<string> {
  const session = await tokenStore.get();
  const res = await fetch(`${API_BASE}${outboxAttachmentPath(messageId, index)}`, {
    headers: session ? { Authorization: `Bearer ${session.token}` } : {},
  });
  if (!res.ok) {
    const parsed = apiErrorSchema.safeParse(await res.json().catch(() => null));
    throw parsed.success
      ? new ApiRequestError(res.status, parsed.data.error.code, parsed.data.error.message)
      : new ApiRequestError(res.status, 'http_error', `The download failed (${res.status}).`);
  }
  return saveBlob(await res.blob(), fileName);
}
