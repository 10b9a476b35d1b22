import { hashKey, type QueryClient, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useCallback, useSyncExternalStore } from 'react';
import { z } from 'zod';

import { apiFetch } from '@/features/api';
import { reviewKeys } from '@/features/review/keys';
import { rideNoticeKeys } from '@/features/notices';
import {
  type DecisionInput,
  type DecisionResponse,
  decisionResponseSchema,
  rideStatusChangeResponseSchema,
  type RideStatusChangeInput,
} from '@/features/review/schema';
import {
  type Finding,
  type FindingInput,
  type FindingPatch,
  findingInputSchema,
  findingListResponseSchema,
  findingResponseSchema,
} from '@/features/notices/finding-schema';
import { rideKeys } from '@/features/rides';

const enc = encodeURIComponent;

/** A finding as the list holds it: `saving` while the server has not yet answered for it. */
export type ListedFinding = Finding & { saving?: boolean };
type FindingsData = { findings: ListedFinding[] };

export type ReviewState = DecisionResponse['reviewState'];

export function useFindings(inspectionId: string) {
  return useQuery({
    queryKey: reviewKeys.findings(inspectionId),
    queryFn: async (): Promise<FindingsData> =>
      apiFetch(`/api/inspections/${enc(inspectionId)}/findings`, { schema: findingListResponseSchema }),
  });
}

/**
 * After any finding change: the findings themselves (only when no other change to them is still on its
 * way, so a refetch never wipes another change's optimistic row), the inspection's detail (its counts),
 * its audit trail and the queue (findings past due move items in it).
 */
function settleFindings(qc: QueryClient, inspectionId: string) {
  const key = reviewKeys.findings(inspectionId);
  const jobs: Promise<unknown>[] = [
    qc.invalidateQueries({ queryKey: reviewKeys.inspection(inspectionId), exact: true }),
    qc.invalidateQueries({ queryKey: reviewKeys.trail(inspectionId) }),
    qc.invalidateQueries({ queryKey: reviewKeys.queues() }),
  ];
  // The mutation that is settling still counts as running here.
  if (qc.isMutating({ mutationKey: key }) <= 1) jobs.push(qc.invalidateQueries({ queryKey: key }));
  return Promise.all(jobs);
}

function patchList(qc: QueryClient, inspectionId: string, fn: (list: ListedFinding[]) => ListedFinding[]) {
  qc.setQueryData<FindingsData>(reviewKeys.findings(inspectionId), (old) =>
    old ? { ...old, findings: fn(old.findings) } : old,
  );
}

let tempCounter = 0;

/** Adds a finding; it shows in the list at once, marked as saving, and is replaced by the server's. */
export function useCreateFinding(inspectionId: string, rideId: string) {
  const qc = useQueryClient();
  const key = reviewKeys.findings(inspectionId);
  return useMutation({
    mutationKey: key,
    mutationFn: (input: FindingInput) =>
      apiFetch(`/api/inspections/${enc(inspectionId)}/findings`, {
        method: 'POST',
        body: input,
        schema: findingResponseSchema,
      }),
    onMutate: async (input) => {
      await qc.cancelQueries({ queryKey: key });
      tempCounter += 1;
      const tempId = `saving-${tempCounter}`;
      const parsed = findingInputSchema.safeParse(input);
      const now = new Date().toISOString();
      patchList(qc, inspectionId, (list) => [
        ...list,
        {
          id: tempId,
          inspectionId,
          rideId,
          number: list.reduce((max, f) => Math.max(max, f.number), 0) + 1,
          severity: input.severity,
          description: parsed.success ? parsed.data.description : input.description.trim(),
          ruleRef: parsed.success ? parsed.data.ruleRef : null,
          requiredAction: parsed.success ? parsed.data.requiredAction : null,
          dueOn: parsed.success ? parsed.data.dueOn : null,
          photoShas: parsed.success ? parsed.data.photoShas : [],
          state: 'open',
          createdAt: now,
          createdByName: null,
          updatedAt: now,
          updatedByName: null,
          closedAt: null,
          closedByName: null,
          stateNote: null,
          saving: true,
        },
      ]);
      return { tempId };
    },
    onError: (_err, _input, ctx) => {
      if (ctx) patchList(qc, inspectionId, (list) => list.filter((f) => f.id !== ctx.tempId));
    },
    onSuccess: ({ finding }, _input, ctx) => {
      patchList(qc, inspectionId, (list) => list.map((f) => (f.id === ctx?.tempId ? finding : f)));
    },
    onSettled: () => settleFindings(qc, inspectionId),
  });
}

type FindingEdit = { finding: Finding; patch: Omit<FindingPatch, 'expectedUpdatedAt'> };

/**
 * Changes a finding from the version the editor started with (`finding.updatedAt`): if someone else
 * changed it since, the server answers 409, the row goes back and the list is fetched again.
 */
export function useUpdateFinding(inspectionId: string) {
  const qc = useQueryClient();
  const key = reviewKeys.findings(inspectionId);
  return useMutation({
    mutationKey: key,
    mutationFn: ({ finding, patch }: FindingEdit) =>
      apiFetch(`/api/findings/${enc(finding.id)}`, {
        method: 'PATCH',
        body: { ...patch, expectedUpdatedAt: finding.updatedAt },
        schema: findingResponseSchema,
      }),
    onMutate: async ({ finding, patch }) => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<FindingsData>(key)?.findings.find((f) => f.id === finding.id);
      patchList(qc, inspectionId, (list) =>
        list.map((f) => (f.id === finding.id ? { ...f, ...withoutUndefined(patch), saving: true } : f)),
      );
      return { before };
    },
    onError: (_err, { finding }, ctx) => {
      const before = ctx?.before;
      if (before) patchList(qc, inspectionId, (list) => list.map((f) => (f.id === finding.id ? before : f)));
    },
    onSuccess: (data) => {
      patchList(qc, inspectionId, (list) => list.map((f) => (f.id === data.finding.id ? data.finding : f)));
    },
    onSettled: () => settleFindings(qc, inspectionId),
  });
}

/** Removes a finding from the list at once; it comes back where it was if the server refuses. */
export function useDeleteFinding(inspectionId: string) {
  const qc = useQueryClient();
  const key = reviewKeys.findings(inspectionId);
  return useMutation({
    mutationKey: key,
    mutationFn: (finding: Finding) => apiFetch(`/api/findings/${enc(finding.id)}`, { method: 'DELETE' }),
    onMutate: async (finding) => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<FindingsData>(key)?.findings.find((f) => f.id === finding.id);
      patchList(qc, inspectionId, (list) => list.filter((f) => f.id !== finding.id));
      return { before };
    },
    onError: (_err, _finding, ctx) => {
      const before = ctx?.before;
      if (before)
        patchList(qc, inspectionId, (list) =>
          list.some((f) => f.id === before.id) ? list : [...list, before].sort((a, b) => a.number - b.number),
        );
    },
    onSettled: () => settleFindings(qc, inspectionId),
  });
}

function withoutUndefined<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

// ——— the decision ———

type ReviewFields = Pick<DecisionResponse, 'reviewState' | 'reviewNote' | 'reviewedByName'> & {
  reviewedAt: string | null;
};

/**
 * The review fields of the inspection's cached detail (kept by the inspection screen under
 * `reviewKeys.inspection(id)` as `{ inspection: { … } }`); anything else in it is left as it is.
 */
const cachedReviewSchema = z.object({
  inspection: z.object({
    reviewState: decisionResponseSchema.shape.reviewState,
    reviewNote: z.string().nullable().optional(),
    reviewedAt: z.string().nullable().optional(),
    reviewedByName: z.string().nullable().optional(),
  }),
});

function withReview(old: unknown, review: ReviewFields): unknown {
  if (typeof old !== 'object' || old === null || !('inspection' in old)) return old;
  const inspection = old.inspection;
  if (typeof inspection !== 'object' || inspection === null) return old;
  return { ...old, inspection: { ...inspection, ...review } };
}

/** Who decided and when, as the inspection screen's cached detail says; null when it holds none. */
export function useCachedReview(inspectionId: string) {
  const qc = useQueryClient();
  // Only this inspection's entry: other queries created while a sibling renders must not re-render us then.
  const subscribe = useCallback(
    (onChange: () => void) => {
      const hash = hashKey(reviewKeys.inspection(inspectionId));
      return qc.getQueryCache().subscribe((event) => {
        if (event.query.queryHash === hash) onChange();
      });
    },
    [qc, inspectionId],
  );
  const data = useSyncExternalStore(subscribe, () => qc.getQueryData(reviewKeys.inspection(inspectionId)));
  const parsed = cachedReviewSchema.safeParse(data);
  return parsed.success ? parsed.data.inspection : null;
}

/**
 * Approves or returns the inspection. The cached detail shows the new state at once and goes back if the
 * server refuses (409: someone decided first); either way the detail is fetched again, and every notice
 * query, since an approval with findings issues a notice (the answer names it).
 */
export function useDecide(inspectionId: string, rideId: string) {
  const qc = useQueryClient();
  const detailKey = reviewKeys.inspection(inspectionId);
  return useMutation({
    mutationFn: (input: DecisionInput) =>
      apiFetch(`/api/inspections/${enc(inspectionId)}/decision`, {
        method: 'POST',
        body: input,
        schema: decisionResponseSchema,
      }),
    onMutate: async (input) => {
      await qc.cancelQueries({ queryKey: detailKey, exact: true });
      const previous = qc.getQueryData(detailKey);
      qc.setQueryData<unknown>(detailKey, (old: unknown) =>
        withReview(old, {
          reviewState: input.decision === 'approve' ? 'approved' : 'returned',
          reviewNote: input.note?.trim() ? input.note.trim() : null,
          reviewedAt: new Date().toISOString(),
          reviewedByName: null,
        }),
      );
      return { previous };
    },
    onError: (_err, _input, ctx) => {
      if (ctx?.previous !== undefined) qc.setQueryData(detailKey, ctx.previous);
    },
    onSuccess: (answer) => {
      qc.setQueryData<unknown>(detailKey, (old: unknown) =>
        withReview(old, {
          reviewState: answer.reviewState,
          reviewNote: answer.reviewNote,
          reviewedAt: answer.reviewedAt,
          reviewedByName: answer.reviewedByName,
        }),
      );
    },
    onSettled: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: detailKey, exact: true }),
        qc.invalidateQueries({ queryKey: reviewKeys.trail(inspectionId) }),
        qc.invalidateQueries({ queryKey: reviewKeys.queues() }),
        qc.invalidateQueries({ queryKey: reviewKeys.trends(rideId) }),
        qc.invalidateQueries({ queryKey: rideNoticeKeys.everyNotice }),
        // The decision may have set the ride's status (a stop, or a follow-up's return to service).
        qc.invalidateQueries({ queryKey: rideKeys.all }),
      ]),
  });
}

// ——— the ride's status ———

type RideStatusChange = RideStatusChangeInput;

/**
 * Changes the ride's status outside a decision (`POST /api/rides/:id/status`, under the status rules): a
 * stop, a restriction, or a supervisor's override back towards service, each with its reason and one
 * notice. The register's ride caches (the desk reads the ride's status from them), the queue, the
 * inspection's audit trail and the notices are refreshed.
 */
export function useSetRideStatus(rideId: string, inspectionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (change: RideStatusChange) =>
      apiFetch(`/api/rides/${enc(rideId)}/status`, {
        method: 'POST',
        body: change,
        schema: rideStatusChangeResponseSchema,
      }),
    onSettled: () =>
      Promise.all([
        qc.invalidateQueries({ queryKey: rideKeys.all }),
        qc.invalidateQueries({ queryKey: reviewKeys.queues() }),
        qc.invalidateQueries({ queryKey: reviewKeys.trail(inspectionId) }),
        qc.invalidateQueries({ queryKey: rideNoticeKeys.everyNotice }),
      ]),
  });
}
