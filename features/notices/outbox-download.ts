import { fileTypeOfName, saveOrShareApiFile } from '@/features/api/ui';
import { outboxAttachmentPath } from '@/features/notices/outbox-api';

/** One attachment of an outbox message: the share sheet on a phone, a download on the web. */
export const downloadOutboxAttachment = (
  messageId: string,
  index: number,
  fileName: string,
): Promise<string> =>
  saveOrShareApiFile(outboxAttachmentPath(messageId, index), fileName, fileTypeOfName(fileName));
