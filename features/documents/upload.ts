import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import * as DocumentPicker from 'expo-document-picker';

import { API_BASE, putBytes } from '@/features/api';
import { isPdfBytes, megabytes } from '@/features/documents/schema';
import { readPickedBytes } from '@/features/documents/read-picked-bytes';
import { tokenStore } from '@/features/session';

/** A file of tens of megabytes should be up within this even on a poor signal; past it, try again. */
const UPLOAD_TIMEOUT_MS = 300_000;

export type PickedPdf = { name: string; bytes: Uint8Array };

/**
 * Lets the person pick one PDF: the file, a problem in words (not a PDF, over `maxBytes`), or null when
 * they cancelled. The bytes are read and checked here, so nothing goes up that the server would refuse.
 */
export async function pickPdf(maxBytes: number): Promise<PickedPdf | { problem: string } | null> {
  const res = await DocumentPicker.getDocumentAsync({
    type: ['application/pdf', '.pdf'],
    copyToCacheDirectory: true,
    multiple: false,
  });
  if (res.canceled || !res.assets?.[0]) return null;
  const asset = res.assets[0];
  const tooBig = { problem: `Larger than the ${megabytes(maxBytes)} limit.` };
  if ((asset.size ?? 0) > maxBytes) return tooBig;
  const bytes = await readPickedBytes(asset);
  if (!isPdfBytes(bytes)) return { problem: `${asset.name} is not a PDF.` };
  if (bytes.length > maxBytes) return tooBig;
  return { name: asset.name, bytes };
}

/**
 * PUT `path` + the bytes' SHA-256 with the raw bytes, telling `onProgress` how far it is; resolves with
 * the hash once the server holds them. `what` names the upload in errors ("Report upload").
 */
export async function uploadPdf(
  path: '/api/documents' | '/api/ndt-reports',
  bytes: Uint8Array,
  what: string,
  onProgress?: (sent: number, total: number) => void,
): Promise<string> {
  const hash = bytesToHex(sha256(bytes));
  const session = await tokenStore.get();
  await putBytes({
    url: `${API_BASE}${path}/${hash}`,
    bytes,
    mime: 'application/pdf',
    token: session?.token ?? null,
    timeoutMs: UPLOAD_TIMEOUT_MS,
    what,
    onProgress,
  });
  return hash;
}

/** A stored document's API path, for `downloadPdf`. */
export const documentPath = (sha: string) => `/api/documents/${encodeURIComponent(sha)}`;
