import { saveBlob } from '@/features/api';

/**
 * Hands a text file to the person: on the web, a download through a temporary Blob link (the file never
 * leaves the page, so it works offline and needs no second request with the session token).
 */
export async function saveTextFile(name: string, text: string, mimeType: string): Promise<string> {
  return saveBlob(new Blob([text], { type: mimeType }), name);
}
