import { API_BASE, ApiRequestError } from '@/features/api/client';
import { apiErrorSchema } from '@/features/api/errors';
import { tokenStore } from '@/features/auth/token-store';
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
  const url = URL.createObjectURL(await res.blob());
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.rel = 'noopener';
  document.body.appendChild(a);
  a.click();
  a.remove();
  // Give the browser a moment to start the download before the URL goes.
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
  return `Downloaded ${fileName}`;
}
