/** Stored PDF documents, the parts that need the platform: picking a PDF and uploading it. */
export { documentPath, pickPdf, uploadPdf, type PickedPdf } from '@/features/documents/upload';
