/** Stored PDF documents: picking, checking and uploading a PDF, and a document's address. */
export { documentPath, pickPdf, uploadPdf, type PickedPdf } from '@/features/documents/upload';
export { documentHashSchema, isPdfBytes, MAX_DOCUMENT_BYTES, megabytes } from '@/features/documents/schema';
