/**
 * Stored PDF documents: what runs anywhere (the hash, the limit, the %PDF- check). Picking and uploading a
 * file needs the platform's file picker: import them from '@/features/documents/ui'.
 */
export { documentHashSchema, isPdfBytes, MAX_DOCUMENT_BYTES, megabytes } from '@/features/documents/schema';
