import { File, Paths } from 'expo-file-system';

import { API_BASE } from '@/features/api';
import { tokenStore } from '@/features/session';
import { outboxAttachmentPath } from '@/features/notices/outbox-api';

/** Saves one attachment of an outbox message: on a phone, into the app's documents folder. */
export async function downloadOutboxAttachment(
  messageId: string,
  index: number,
  fileName: string,
): Promise<string> {
  const session = await tokenStore.get();
  const target = new File(Paths.document, fileName);
  await File.downloadFileAsync(`${API_BASE}${outboxAttachmentPath(messageId, index)}`, target, {
    headers: session ? { Authorization: `Bearer ${session.token}` } : {},
    idempotent: true,
  });
  return `Saved ${fileName} to this device’s documents`;
}
