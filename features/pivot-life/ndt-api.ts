import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { API_BASE, apiFetch, putBytes } from '@/features/api';
import { pivotLifeKeys } from '@/features/pivot-life/api';
import { ndtRecordCreatedSchema, rideNdtSchema, type NdtRecordInput } from '@/features/pivot-life/ndt-schema';
import { tokenStore } from '@/features/session';
import { ApiRequestError } from '@/lib/api-errors';

export const ndtKeys = {
  ride: (rideId: string) => [...pivotLifeKeys.ride(rideId), 'ndt'] as const,
};

/** The server's limit (server/pivot-life/ndt-report-store.ts), checked first so a big file fails at once. */
export const MAX_NDT_REPORT_BYTES = 20 * 1024 * 1024;

const enc = encodeURIComponent;

export function useRideNdtQuery(rideId: string) {
  return useQuery({
    queryKey: ndtKeys.ride(rideId),
    queryFn: () => apiFetch(`/api/rides/${enc(rideId)}/ndt`, { schema: rideNdtSchema }),
    staleTime: 60 * 1000,
  });
}

/** The report's bytes start with the PDF header "%PDF-" (ISO 32000-1 §7.5.2), as the server checks. */
export function isPdfBytes(bytes: Uint8Array): boolean {
  const header = [0x25, 0x50, 0x44, 0x46, 0x2d];
  return bytes.length >= header.length && header.every((b, i) => bytes[i] === b);
}

/** A report of up to 20 MB should be up within this even on a poor signal; past it, try again. */
const REPORT_TIMEOUT_MS = 300_000;

/**
 * PUT /api/ndt-reports/:sha256 with the raw bytes, telling `onProgress` how far it is; resolves with the
 * hash once the server holds them.
 */
export async function uploadNdtReport(
  bytes: Uint8Array,
  onProgress?: (sent: number, total: number) => void,
): Promise<string> {
  const hash = bytesToHex(sha256(bytes));
  const session = await tokenStore.get();
  await putBytes({
    url: `${API_BASE}/api/ndt-reports/${hash}`,
    bytes,
    mime: 'application/pdf',
    token: session?.token ?? null,
    timeoutMs: REPORT_TIMEOUT_MS,
    what: 'Report upload',
    onProgress,
  });
  return hash;
}

export type AddNdtRecord = {
  input: Omit<NdtRecordInput, 'reportSha256'>;
  report: Uint8Array | null;
  /** How far the report's upload is, in bytes. */
  onProgress?: (sent: number, total: number) => void;
};

/** Uploads the report (when there is one), then stores the record; the ride's NDT and life follow. */
export function useAddNdtRecordMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ input, report, onProgress }: AddNdtRecord) => {
      let reportSha256: string | undefined;
      if (report) {
        try {
          reportSha256 = await uploadNdtReport(report, onProgress);
        } catch (err) {
          // Name the field the report came from, so the form shows the problem beside it.
          if (err instanceof ApiRequestError)
            throw new ApiRequestError(err.status, err.code, err.message, [
              { path: 'report', message: err.message },
            ]);
          throw err;
        }
      }
      return apiFetch(`/api/rides/${enc(rideId)}/ndt-records`, {
        body: { ...input, ...(reportSha256 ? { reportSha256 } : {}) },
        schema: ndtRecordCreatedSchema,
      });
    },
    onSuccess: () => client.invalidateQueries({ queryKey: pivotLifeKeys.ride(rideId) }),
  });
}

/** The report's API path, for `downloadPdf`. */
export const ndtReportPath = (sha: string) => `/api/ndt-reports/${enc(sha)}`;
