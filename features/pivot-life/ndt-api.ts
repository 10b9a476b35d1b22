import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { uploadPdf } from '@/features/documents/ui';
import { pivotLifeKeys } from '@/features/pivot-life/api';
import { ndtRecordCreatedSchema, rideNdtSchema, type NdtRecordInput } from '@/features/pivot-life/ndt-schema';
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

/** PUT /api/ndt-reports/:sha256 with the raw bytes; resolves with the hash once the server holds them. */
export const uploadNdtReport = (bytes: Uint8Array, onProgress?: (sent: number, total: number) => void) =>
  uploadPdf('/api/ndt-reports', bytes, 'Report upload', onProgress);

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
