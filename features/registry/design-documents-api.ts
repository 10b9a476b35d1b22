import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';

import { apiFetch } from '@/features/api';
import { uploadPdf } from '@/features/documents/ui';
import { registryKeys } from '@/features/registry/api';
import {
  designDocumentResponseSchema,
  versionDocumentsSchema,
  type DesignDocumentInput,
} from '@/features/registry/schema';
import { ApiRequestError } from '@/lib/api-errors';

const enc = encodeURIComponent;

export const designDocumentKeys = {
  /** Everything about a ride's design documents: any change refreshes all of its versions' lists. */
  ride: (rideId: string) => [...registryKeys.design(rideId), 'documents'] as const,
  version: (rideId: string, version: number) => [...designDocumentKeys.ride(rideId), version] as const,
  inForce: (rideId: string) => [...designDocumentKeys.ride(rideId), 'in-force'] as const,
};

/** A version's documents (staff). */
export function useVersionDocumentsQuery(rideId: string, version: number) {
  return useQuery({
    queryKey: designDocumentKeys.version(rideId, version),
    queryFn: () =>
      apiFetch(`/api/rides/${enc(rideId)}/design/versions/${version}/documents`, {
        schema: versionDocumentsSchema,
      }),
    staleTime: 60 * 1000,
  });
}

/** The documents of the version in force, for everyone who may see the ride (operators included). */
export function useRideDocumentsQuery(rideId: string) {
  return useQuery({
    queryKey: designDocumentKeys.inForce(rideId),
    queryFn: () => apiFetch(`/api/rides/${enc(rideId)}/documents`, { schema: versionDocumentsSchema }),
    staleTime: 60 * 1000,
  });
}

export type AttachDesignDocument = {
  input: Omit<DesignDocumentInput, 'sha256'>;
  bytes: Uint8Array;
  onProgress?: (sent: number, total: number) => void;
};

/** Uploads the PDF (`PUT /api/documents/:sha256`), then attaches it to the version. */
export function useAttachDesignDocumentMutation(rideId: string, version: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ input, bytes, onProgress }: AttachDesignDocument) => {
      let sha256: string;
      try {
        sha256 = await uploadPdf('/api/documents', bytes, 'Document upload', onProgress);
      } catch (err) {
        // Name the field the file came from, so the form shows the problem beside it.
        if (err instanceof ApiRequestError)
          throw new ApiRequestError(err.status, err.code, err.message, [
            { path: 'file', message: err.message },
          ]);
        throw err;
      }
      return apiFetch(`/api/rides/${enc(rideId)}/design/versions/${version}/documents`, {
        body: { ...input, sha256 },
        schema: designDocumentResponseSchema,
      });
    },
    onSuccess: () => client.invalidateQueries({ queryKey: designDocumentKeys.ride(rideId) }),
  });
}

/** Removes a document from one version (the file stays stored; the audit log keeps who and when). */
export function useDetachDesignDocumentMutation(rideId: string, version: number) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (documentId: string) =>
      apiFetch(`/api/rides/${enc(rideId)}/design/versions/${version}/documents/${enc(documentId)}`, {
        method: 'DELETE',
        schema: designDocumentResponseSchema,
      }),
    onSuccess: () => client.invalidateQueries({ queryKey: designDocumentKeys.ride(rideId) }),
  });
}
