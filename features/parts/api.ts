import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { uploadPdf } from '@/features/documents/ui';
import {
  partReplacementCreatedSchema,
  ridePartsSchema,
  type PartReplacementInput,
} from '@/features/parts/schema';
import { ApiRequestError } from '@/lib/api-errors';

const enc = encodeURIComponent;

export const partKeys = {
  ride: (rideId: string) => ['parts', rideId] as const,
};

export function useRidePartsQuery(rideId: string) {
  return useQuery({
    queryKey: partKeys.ride(rideId),
    queryFn: () => apiFetch(`/api/rides/${enc(rideId)}/parts`, { schema: ridePartsSchema }),
    staleTime: 60 * 1000,
  });
}

/** A PDF picked for the record, with what it is. */
export type PartPdf = { name: string; title: string; bytes: Uint8Array };

export type AddPartReplacement = {
  input: Omit<PartReplacementInput, 'documents'>;
  files: PartPdf[];
  /** How far the uploads are, in bytes over all the files. */
  onProgress?: (sent: number, total: number) => void;
};

/** Uploads each PDF in turn (`PUT /api/documents/:sha256`), then stores the record that names them. */
export function useAddPartReplacementMutation(rideId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ input, files, onProgress }: AddPartReplacement) => {
      const total = files.reduce((n, f) => n + f.bytes.length, 0);
      let done = 0;
      const documents: { sha256: string; title: string }[] = [];
      for (const [i, f] of files.entries()) {
        try {
          const sha256 = await uploadPdf('/api/documents', f.bytes, `Upload of ${f.name}`, (sent) =>
            onProgress?.(done + sent, total),
          );
          documents.push({ sha256, title: f.title });
          done += f.bytes.length;
        } catch (err) {
          // Name the file it came from, so the form shows the problem beside it.
          if (err instanceof ApiRequestError)
            throw new ApiRequestError(err.status, err.code, err.message, [
              { path: `documents.${i}`, message: err.message },
            ]);
          throw err;
        }
      }
      return apiFetch(`/api/rides/${enc(rideId)}/parts`, {
        body: { ...input, documents },
        schema: partReplacementCreatedSchema,
      });
    },
    onSuccess: () => client.invalidateQueries({ queryKey: partKeys.ride(rideId) }),
  });
}
