import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { API_BASE, apiFetch } from '@/features/api';
import { pivotLifeKeys } from '@/features/pivot-life/api';
import { ndtRecordCreatedSchema, rideNdtSchema, type NdtRecordInput } from '@/features/pivot-life/ndt-schema';
import { tokenStore } from '@/features/session';
import { ApiRequestError, errorOfResponse, OfflineError } from '@/lib/api-errors';

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

/** PUT /api/ndt-reports/:sha256 with the raw bytes; resolves with the hash once the server holds them. */
export async function uploadNdtReport(bytes: Uint8Array): Promise<string> {
  const hash = bytesToHex(sha256(bytes));
  const session = await tokenStore.get();
  let res: Response;
  try {
    res = await fetch(`${API_BASE}/api/ndt-reports/${hash}`, {
      method: 'PUT',
      headers: {
        'Content-Type': 'application/pdf',
        Accept: 'application/json',
        ...(session ? { Authorization: `Bearer ${session.token}` } : {}),
      },
      // A view of exactly the file's bytes (the array may sit in a larger buffer).
      body: bytes.slice().buffer,
    });
  } catch (err) {
    throw new OfflineError(err);
  }
  if (!res.ok) throw await errorOfResponse(res, `The report could not be uploaded (${res.status}).`);
  return hash;
}

export type AddNdtRecord = { input: Omit<NdtRecordInput, 'reportSha256'>; report: Uint8Array | null };

/** Uploads the report (when there is one), then stores the record; the ride's NDT and life follow. */
export function useAddNdtRecordMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ input, report }: AddNdtRecord) => {
      let reportSha256: string | undefined;
      if (report) {
        try {
          reportSha256 = await uploadNdtReport(report);
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
