/**
 * The inspector's data on the phone: rides, design data and templates from the device cache, drafts
 * saved on every change, and submission into the outbox. Reads go to the device database, never the
 * network, so all of this works with no signal.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { randomUUID } from 'expo-crypto';
import { useCallback, useRef, useState } from 'react';

import { useDeviceDb } from '@/features/device-db/provider';
import {
  readAssignments,
  readCurrentDesign,
  readDesignVersion,
  readRide,
  readRides,
  readTemplates,
} from '@/features/device-db/cache';
import { listDrafts, loadDraft, saveDraft, submitDraft } from '@/features/device-db/drafts';
import { getPhotoDataUri } from '@/features/device-db/photos';
import { analyseInspection, previewOf } from '@/features/inspections/analysis';
import { type Draft, newDraft, toRecord } from '@/features/inspections/draft';
import type { InspectionType } from '@/features/inspections/schema';
import { type ChecklistTemplate, checklistTemplateSchema } from '@/features/registry/schema';

export const fieldKeys = {
  all: ['field'] as const,
  rides: () => [...fieldKeys.all, 'rides'] as const,
  ride: (id: string) => [...fieldKeys.all, 'ride', id] as const,
  draft: (id: string) => [...fieldKeys.all, 'draft', id] as const,
  photo: (sha: string) => [...fieldKeys.all, 'photo', sha] as const,
};

/** Device reads are local and cheap; refetch on focus keeps lists honest after a sync. */
const DEVICE_STALE_MS = 0;

function templateFor(list: unknown[], id?: string | null): ChecklistTemplate | null {
  for (const raw of list) {
    const parsed = checklistTemplateSchema.safeParse(raw);
    if (parsed.success && (!id || parsed.data.id === id)) return parsed.data;
  }
  return null;
}

/** Rides on the phone, assigned ones first, with any draft in progress for each. */
export function useFieldRidesQuery() {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldKeys.rides(),
    staleTime: DEVICE_STALE_MS,
    queryFn: async () => {
      const [rides, assignments, drafts] = await Promise.all([
        readRides(dev),
        readAssignments(dev),
        listDrafts(dev),
      ]);
      const assigned = new Map(assignments.map((a) => [a.rideId, a]));
      return rides
        .map((ride) => ({
          ride,
          assignment: assigned.get(ride.id) ?? null,
          drafts: drafts.filter((d) => d.rideId === ride.id),
        }))
        .sort(
          (a, b) => Number(!!b.assignment) - Number(!!a.assignment) || a.ride.name.localeCompare(b.ride.name),
        );
    },
  });
}

/** Everything a recording needs about its ride: summary, design version and checklist template. */
export function useFieldRideQuery(
  rideId: string | null,
  designVersionId?: string | null,
  templateId?: string | null,
) {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: [...fieldKeys.ride(rideId ?? ''), designVersionId ?? 'current', templateId ?? 'any'],
    enabled: !!rideId,
    staleTime: DEVICE_STALE_MS,
    queryFn: async () => {
      const ride = await readRide(dev, rideId as string);
      if (!ride) return null;
      const design = designVersionId
        ? await readDesignVersion(dev, designVersionId)
        : await readCurrentDesign(dev, ride.id);
      const template = templateFor(await readTemplates(dev, ride.rideClass), templateId);
      return { ride, design, template };
    },
  });
}

export function useDraftQuery(id: string) {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldKeys.draft(id),
    staleTime: Infinity,
    queryFn: async () => (await loadDraft<Draft>(dev, id))?.data ?? null,
  });
}

/** Starts a recording: a new draft saved on the device before the screen opens. */
export function useStartInspectionMutation() {
  const dev = useDeviceDb();
  const client = useQueryClient();
  return useMutation({
    mutationFn: async ({ rideId, type }: { rideId: string; type: InspectionType }) => {
      const ride = await readRide(dev, rideId);
      if (!ride) throw new Error('This ride is not on the phone. Sync, then try again.');
      const design = await readCurrentDesign(dev, rideId);
      const template = templateFor(await readTemplates(dev, ride.rideClass));
      const draft = newDraft({
        id: randomUUID(),
        ride,
        designVersionId: design?.id ?? null,
        template,
        type,
        now: new Date(),
      });
      await saveDraft(dev, { id: draft.id, rideId: draft.rideId, data: draft });
      return draft;
    },
    onSuccess: (draft) => {
      client.setQueryData(fieldKeys.draft(draft.id), draft);
      void client.invalidateQueries({ queryKey: fieldKeys.rides() });
    },
  });
}

/**
 * Edits a draft: each change is applied to the latest version (never a stale copy from an earlier
 * render, so quick taps cannot undo each other), shown at once, and saved in order. `saving` stays true
 * until the last change is on the device, so the screen can say when it is safe to put the phone away.
 */
export function useDraftEditor(id: string) {
  const dev = useDeviceDb();
  const client = useQueryClient();
  const [saving, setSaving] = useState(0);
  const [error, setError] = useState<Error | null>(null);
  const queue = useRef<Promise<void>>(Promise.resolve());
  const update = useCallback(
    (fn: (d: Draft) => Draft) => {
      const current = client.getQueryData<Draft | null>(fieldKeys.draft(id));
      if (!current) return;
      const next = fn(current);
      client.setQueryData(fieldKeys.draft(id), next);
      setSaving((n) => n + 1);
      queue.current = queue.current
        .then(() => saveDraft(dev, { id: next.id, rideId: next.rideId, data: next }))
        .then(
          () => setError(null),
          (err: unknown) => setError(err instanceof Error ? err : new Error(String(err))),
        )
        .finally(() => setSaving((n) => n - 1));
    },
    [client, dev, id],
  );
  return { update, saving: saving > 0, error };
}

/** Puts the finished inspection in the outbox with the phone's own load-check summary. */
export function useSubmitDraftMutation() {
  const dev = useDeviceDb();
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (draft: Draft) => {
      const design = draft.designVersionId ? await readDesignVersion(dev, draft.designVersionId) : null;
      const preview = design ? previewOf(analyseInspection(design.data, draft.readings)) : null;
      return submitDraft(dev, toRecord(draft, preview, new Date()));
    },
    // The recording screen leaves on success; re-reading its draft now would flash "not found".
    onSuccess: () => client.invalidateQueries({ queryKey: fieldKeys.rides() }),
  });
}

export function usePhotoUriQuery(sha: string) {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldKeys.photo(sha),
    staleTime: Infinity,
    queryFn: () => getPhotoDataUri(dev, sha),
  });
}
