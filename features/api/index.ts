/** What other features and the server may use from api: runs anywhere (no React Native). */
export { API_BASE, apiFetch, createApiClient } from '@/features/api/client';
export type { ApiFetch } from '@/features/api/client';
export { putBytes } from '@/features/api/put-bytes';
export type { PutBytes } from '@/features/api/put-bytes';
export { saveBlob } from '@/features/api/save-blob';
export { makeQueryClient } from '@/features/api/query-client';
export { reviewRoot } from '@/features/api/query-roots';
export { onReachabilityChange, reportServerReached, serverReached } from '@/features/api/reachability';
