/**
 * The inspector's data on the phone: rides, design data and templates from the device cache, drafts
 * saved on every change, and submission into the outbox. Reads go to the device database, never the
 * network, so all of this works with no signal.
 */
import { type QueryClient, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { randomUUID } from 'expo-crypto';
import { useCallback, useRef, useState } from 'react';

import {
  fieldKeys,
  listDrafts,
  loadDraft,
  saveDraft,
  submitDraft,
  getOutboxItem,
  listOutbox,
  getPhotoDataUri,
} from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';
import { compareRoundPlaces, scheduleSchema } from '@/features/registry/schema';
import {
  readAssignments,
  readCurrentDesign,
  readDecisions,
  readDesignVersion,
  readRide,
  readRides,
  readTemplates,
} from '@/features/sync';
import { analyseRecord, previewOf, type Draft, newCorrection, newDraft, toRecord } from '@/features/records';
import type { Declaration, InspectionType } from '@/features/records/schema';
import { buildSentList } from '@/features/inspections/sent';
import {
  type ChecklistTemplate,
  checklistTemplateSchema,
  pickChecklistTemplate,
} from '@/features/registry/schema';

/** Device reads are local and cheap; refetch on focus keeps lists honest after a sync. */
const DEVICE_STALE_MS = 0;

function parseTemplates(list: unknown[]): ChecklistTemplate[] {
  return list.flatMap((raw) => {
    const parsed = checklistTemplateSchema.safeParse(raw);
    return parsed.success ? [parsed.data] : [];
  });
}

/** The template a draft names (its version is the draft's), else the first on the phone. */
function templateFor(list: unknown[], id?: string | null): ChecklistTemplate | null {
  const templates = parseTemplates(list);
  return (id ? templates.find((t) => t.id === id) : templates[0]) ?? null;
}

/** A draft just saved on the device: the recording screen reads it at once, the rides list shows it. */
function showStartedDraft(client: QueryClient, draft: Draft) {
  client.setQueryData(fieldKeys.draft(draft.id), draft);
  void client.invalidateQueries({ queryKey: fieldKeys.rides() });
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
      // Assigned rides first, in the planner's order: day of the round, then the day's travel order.
      const placeOf = (e: { ride: { name: string }; assignment: unknown }) => {
        const s = scheduleSchema.safeParse(e.assignment);
        return s.success ? { ...s.data, name: e.ride.name } : { name: e.ride.name };
      };
      return rides
        .map((ride) => ({
          ride,
          assignment: assigned.get(ride.id) ?? null,
          drafts: drafts.filter((d) => d.rideId === ride.id),
        }))
        .sort(
          (a, b) =>
            Number(!!b.assignment) - Number(!!a.assignment) || compareRoundPlaces(placeOf(a), placeOf(b)),
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
      // The class's checklist for this type, else its general one (the recording says which).
      const { template } = pickChecklistTemplate(
        parseTemplates(await readTemplates(dev, ride.rideClass)),
        ride.rideClass,
        type,
      );
      const draft = newDraft({
        id: randomUUID(),
        ride,
        designVersionId: design?.id ?? null,
        template,
        type,
        now: new Date(),
        bulletins: ride.openBulletins,
      });
      await saveDraft(dev, { id: draft.id, rideId: draft.rideId, data: draft });
      return draft;
    },
    onSuccess: (draft) => showStartedDraft(client, draft),
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
    mutationFn: async ({
      draft,
      declaration,
      template = null,
    }: {
      draft: Draft;
      declaration: Declaration;
      /** The template the answers belong to: its limits count in the preview, as on the server. */
      template?: ChecklistTemplate | null;
    }) => {
      const design = draft.designVersionId ? await readDesignVersion(dev, draft.designVersionId) : null;
      const content = template?.version.version === draft.templateVersion ? template.version.content : null;
      const preview = design ? previewOf(analyseRecord(design.data, draft, content)) : null;
      return submitDraft(dev, toRecord(draft, preview, new Date(), declaration));
    },
    // The recording screen leaves on success; re-reading its draft now would flash "not found".
    onSuccess: () =>
      Promise.all([
        client.invalidateQueries({ queryKey: fieldKeys.rides() }),
        client.invalidateQueries({ queryKey: fieldKeys.sent() }),
      ]),
  });
}

/**
 * What the inspector has sent and what the supervisors decided, read from the phone alone: the outbox,
 * the decisions the last sync brought, and any correction being recorded. Returned ones come first.
 */
export function useSentInspectionsQuery() {
  const dev = useDeviceDb();
  return useQuery({
    queryKey: fieldKeys.sent(),
    staleTime: DEVICE_STALE_MS,
    queryFn: async () => {
      const [outbox, decisions, rides, drafts] = await Promise.all([
        listOutbox(dev),
        readDecisions(dev),
        readRides(dev),
        listDrafts(dev),
      ]);
      const corrections: { id: string; amendsId: string }[] = [];
      for (const d of drafts) {
        const amendsId = (await loadDraft<Draft>(dev, d.id))?.data.amendsId;
        if (amendsId) corrections.push({ id: d.id, amendsId });
      }
      return buildSentList({ outbox, decisions, rides, corrections });
    },
  });
}

/**
 * Starts correcting a returned inspection: a new draft from the original record, sent later as its
 * amendment. Saved on the device before the recording screen opens.
 */
export function useStartCorrectionMutation() {
  const dev = useDeviceDb();
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (inspectionId: string) => {
      const original = await getOutboxItem(dev, inspectionId);
      if (!original)
        throw new Error('The returned inspection is not on this phone. Start a new inspection instead.');
      const ride = await readRide(dev, original.record.rideId);
      const draft = newCorrection({
        id: randomUUID(),
        original: original.record,
        rideName: ride?.name ?? 'Ride',
        now: new Date(),
      });
      await saveDraft(dev, { id: draft.id, rideId: draft.rideId, data: draft });
      return draft;
    },
    onSuccess: (draft) => {
      showStartedDraft(client, draft);
      void client.invalidateQueries({ queryKey: fieldKeys.sent() });
    },
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
