/** What other features may use from api: everything else in the folder is its own. */
export { API_BASE, apiFetch, createApiClient } from '@/features/api/client';
export type { ApiFetch } from '@/features/api/client';
export { downloadPdf, pdfFileName } from '@/features/api/pdf-download';
export type { PaperSize } from '@/features/api/pdf-download';
export { saveBlob } from '@/features/api/pdf-download.web';
export { makeQueryClient } from '@/features/api/query-client';
export { reviewRoot } from '@/features/api/query-roots';
export { onReachabilityChange, reportServerReached, serverReached } from '@/features/api/reachability';
