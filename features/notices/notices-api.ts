import {
  type QueryClient,
  keepPreviousData,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import { z } from 'zod';

import { API_BASE, apiFetch, reviewRoot } from '@/features/api';
import { OfflineError, errorOfResponse } from '@/lib/api-errors';
import { tokenStore } from '@/features/session';
import { noticeKeys } from '@/features/notices/keys';
import {
  type CorrectiveActionInput,
  type FindingCloseInput,
  type FindingReopenInput,
  type NoticeDetail,
  type NoticeFinding,
  type NoticeListQuery,
  findingStateResponseSchema,
  noticeListResponseSchema,
  noticeResponseSchema,
} from '@/features/notices/schema';
import { type QueryParams, toSearch } from '@/lib/list-params';
import { rideKeys } from '@/features/rides';

const enc = encodeURIComponent;

/** Notices change when someone acts on them; an operator may leave one open while fixing the ride. */
const NOTICE_STALE_MS = 15 * 1000;

/** Drops empty values, so the same filters spelt differently share one cache entry. */
function cleanQuery(query: Partial<NoticeListQuery>): Record<string, string | number> {
  const out: Record<string, string | number> = {};
  for (const [key, value] of Object.entries(query)) {
    if (value === undefined || value === null || value === '') continue;
    out[key] = value;
  }
  return out;
}

/** One page of notices, newest first; the server gives operators their own company's only. */
export function useNoticeList(query: Partial<NoticeListQuery>, enabled = true) {
  const cleaned = cleanQuery(query);
  return useQuery({
    queryKey: noticeKeys.list(cleaned),
    queryFn: ({ signal }) =>
      apiFetch(`/api/notices${toSearch(cleaned as QueryParams)}`, {
        schema: noticeListResponseSchema,
        signal,
      }),
    staleTime: NOTICE_STALE_MS,
    placeholderData: keepPreviousData,
    enabled,
  });
}

export async function fetchNotice(id: string, signal?: AbortSignal): Promise<NoticeDetail> {
  return (await apiFetch(`/api/notices/${enc(id)}`, { schema: noticeResponseSchema, signal })).notice;
}

/** One notice: the document as issued, the acknowledgement, deliveries and its findings as they are now. */
export function useNotice(id: string, enabled = true) {
  return useQuery({
    queryKey: noticeKeys.detail(id),
    queryFn: ({ signal }) => fetchNotice(id, signal),
    staleTime: NOTICE_STALE_MS,
    enabled: enabled && id !== '',
  });
}

// ——— changes ———

function patchNotice(qc: QueryClient, id: string, fn: (notice: NoticeDetail) => NoticeDetail) {
  qc.setQueryData<NoticeDetail>(noticeKeys.detail(id), (old) => (old ? fn(old) : old));
}

function patchFinding(qc: QueryClient, noticeId: string, finding: NoticeFinding) {
  patchNotice(qc, noticeId, (n) => ({
    ...n,
    findings: n.findings.map((f) => (f.id === finding.id ? finding : f)),
  }));
}

const findingIn = (qc: QueryClient, noticeId: string, findingId: string) =>
  qc.getQueryData<NoticeDetail>(noticeKeys.detail(noticeId))?.findings.find((f) => f.id === findingId);

/**
 * Acknowledges receipt for the operator's company. The notice says who and when at once; the server's
 * answer (the first acknowledgement, if a colleague was quicker) replaces it, and a refusal puts it back.
 */
export function useAcknowledge(noticeId: string, userName: string) {
  const qc = useQueryClient();
  const key = noticeKeys.detail(noticeId);
  return useMutation({
    mutationKey: key,
    mutationFn: () =>
      apiFetch(`/api/notices/${enc(noticeId)}/acknowledge`, { method: 'POST', schema: noticeResponseSchema }),
    onMutate: async () => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<NoticeDetail>(key);
      patchNotice(qc, noticeId, (n) =>
        n.acknowledgedAt
          ? n
          : { ...n, acknowledgedAt: new Date().toISOString(), acknowledgedByName: userName },
      );
      return { before };
    },
    onError: (_err, _v, ctx) => {
      if (ctx?.before) qc.setQueryData(key, ctx.before);
    },
    onSuccess: ({ notice }) => qc.setQueryData(key, notice),
    onSettled: () => invalidateOtherNotices(qc, noticeId),
  });
}

/**
 * A change to one finding of a notice (`POST /api/findings/:id/<path>`). The finding shows as `optimistic`
 * makes it at once; the server's finding replaces it, a refusal puts the one before back, and `settle`
 * refreshes what the change may have touched.
 */
function useFindingChange<V extends { findingId: string; input: unknown }>(
  noticeId: string,
  path: 'actions' | 'close' | 'reopen',
  optimistic: (before: NoticeFinding, change: V) => NoticeFinding,
) {
  const qc = useQueryClient();
  const key = noticeKeys.detail(noticeId);
  return useMutation({
    mutationKey: key,
    mutationFn: ({ findingId, input }: V) =>
      apiFetch(`/api/findings/${enc(findingId)}/${path}`, {
        method: 'POST',
        body: input,
        schema: findingStateResponseSchema,
      }),
    onMutate: async (change: V) => {
      await qc.cancelQueries({ queryKey: key });
      const before = findingIn(qc, noticeId, change.findingId);
      if (before) patchFinding(qc, noticeId, optimistic(before, change));
      return { before };
    },
    onError: (_err, _v, ctx) => {
      if (ctx?.before) patchFinding(qc, noticeId, ctx.before);
    },
    onSuccess: (answer) => patchFinding(qc, noticeId, answer.finding),
    onSettled: () => settle(qc, noticeId),
  });
}

/** What the operator did about a finding, sent after its photos are on the server. */
type ReportAction = { findingId: string; input: CorrectiveActionInput };

let savingCounter = 0;
/** Ids of corrective actions shown before the server has them start with this. */
export const SAVING_PREFIX = 'saving-';

/**
 * Reports a corrective action. The action shows under its finding at once (marked as sending) and the
 * finding reads "action reported"; the server's finding replaces both, or they go if it refuses.
 */
export function useReportAction(noticeId: string, userName: string) {
  return useFindingChange<ReportAction>(noticeId, 'actions', (before, { findingId, input }) => {
    savingCounter += 1;
    return {
      ...before,
      state: before.state === 'open' ? 'action_reported' : before.state,
      correctiveActions: [
        ...before.correctiveActions,
        {
          id: `${SAVING_PREFIX}${savingCounter}`,
          findingId,
          note: input.note.trim(),
          photoShas: [...new Set(input.photoShas ?? [])],
          reportedAt: new Date().toISOString(),
          reportedByName: userName,
        },
      ],
    };
  });
}

type CloseFinding = { findingId: string; input: FindingCloseInput };
type ReopenFinding = { findingId: string; input: FindingReopenInput };

/**
 * Verifies and closes a finding. It reads "closed" at once; the server's answer brings who closed it and,
 * when the ride's status followed, the ride now and the status notice issued.
 */
export function useCloseFinding(noticeId: string, userName: string) {
  return useFindingChange<CloseFinding>(noticeId, 'close', (before, { input }) => {
    const at = new Date().toISOString();
    return {
      ...before,
      state: 'closed',
      closedAt: at,
      closedByName: userName,
      stateNote: input.note?.trim() ? input.note.trim() : null,
      updatedAt: at,
      updatedByName: userName,
    };
  });
}

/** Reopens a finding with the verifier's comment (required); the ride may stop again as a result. */
export function useReopenFinding(noticeId: string, userName: string) {
  return useFindingChange<ReopenFinding>(noticeId, 'reopen', (before, { input }) => ({
    ...before,
    state: 'open',
    closedAt: null,
    closedByName: null,
    stateNote: input.note.trim(),
    updatedAt: new Date().toISOString(),
    updatedByName: userName,
  }));
}

/**
 * Every notice query except one notice's detail: the lists (open counts, acknowledgements), other
 * notices (a status notice may have been issued) and any other view keyed under the notices' prefix.
 */
function invalidateOtherNotices(qc: QueryClient, noticeId: string) {
  const detail = noticeKeys.detail(noticeId);
  return qc.invalidateQueries({
    queryKey: noticeKeys.all,
    predicate: (q) => !(q.queryKey.length === detail.length && q.queryKey.every((k, i) => k === detail[i])),
  });
}

/**
 * After a finding changes: every other notice query, the review desk (its queue counts findings past
 * due and the inspection shows its findings) and the rides (a ride's status may have followed). The
 * notice's own detail refetches only when no other change to it is on its way, so a refetch never wipes
 * another change shown ahead of the server.
 */
function settle(qc: QueryClient, noticeId: string) {
  const jobs: Promise<unknown>[] = [
    invalidateOtherNotices(qc, noticeId),
    qc.invalidateQueries({ queryKey: reviewRoot }),
    qc.invalidateQueries({ queryKey: rideKeys.all }),
  ];
  // The mutation that is settling still counts as running here.
  if (qc.isMutating({ mutationKey: noticeKeys.detail(noticeId) }) <= 1)
    jobs.push(qc.invalidateQueries({ queryKey: noticeKeys.detail(noticeId), exact: true }));
  return Promise.all(jobs);
}

const resendResponseSchema = z.object({ queued: z.number().int() });

/** Queues the notice's e-mail again for addresses that have not had it (supervisors and admins). */
export function useResend(noticeId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () =>
      apiFetch(`/api/notices/${enc(noticeId)}/resend`, { method: 'POST', schema: resendResponseSchema }),
    // Deliveries show on the notice, in the lists and wherever else notices are listed.
    onSettled: () => qc.invalidateQueries({ queryKey: noticeKeys.all }),
  });
}

// ——— evidence photos ———

type EvidencePhoto = { sha256: string; mime: string; bytes: Uint8Array };

/**
 * Puts a photo's bytes on the server under their SHA-256 (`PUT /api/photos/:sha256`). The server keeps
 * photos by hash, so sending one it already has is a success and a retry never stores it twice.
 */
export async function putEvidencePhoto(photo: EvidencePhoto): Promise<void> {
  const session = await tokenStore.get();
  const headers: Record<string, string> = { 'Content-Type': photo.mime, Accept: 'application/json' };
  if (session) headers.Authorization = `Bearer ${session.token}`;
  let res: Response;
  try {
    res = await fetch(`${API_BASE}/api/photos/${photo.sha256}`, {
      method: 'PUT',
      headers,
      // Exactly the photo's bytes (the array may be a view into a larger buffer).
      body: photo.bytes.slice().buffer,
    });
  } catch (err) {
    throw new OfflineError(err);
  }
  if (!res.ok) throw await errorOfResponse(res, `Photo upload failed (${res.status}).`);
}
