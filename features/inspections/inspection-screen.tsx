import { toByteArray } from 'base64-js';
import { randomUUID } from 'expo-crypto';
import { router } from 'expo-router';
import { useEffect, useMemo, useRef, useState } from 'react';
import { Image, type ScrollView, StyleSheet, View } from 'react-native';

import { ActionBar } from '@/components/action-bar';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FullScreenWait } from '@/components/full-screen-wait';
import { Screen } from '@/components/screen';
import { IconButton } from '@/components/icon-button';
import { type Step, StepTabs } from '@/components/step-tabs';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { UndoSnackbar } from '@/components/undo-snackbar';
import { formatLocalStamp } from '@/lib/dates';
import { useSession } from '@/features/auth';
import { putPhotoBlob } from '@/features/device-db';
import { useDeviceDb } from '@/features/device-db/ui';
import {
  analyseRecord,
  type Draft,
  addPhoto,
  addReading,
  answerItem,
  draftProblems,
  draftProgress,
  measuredRiderOf,
  putMotionRecord,
  removeMotionRecord,
  setNotes,
  updatePhoto,
} from '@/features/records';
import { ChecklistSection } from '@/features/inspections/checklist-section';
import { todayHref } from '@/features/inspections/hrefs';
import {
  useDraftQuery,
  useFieldRideQuery,
  usePhotoUriQuery,
  useDraftEditor,
  useSubmitDraftMutation,
} from '@/features/inspections/field-api';
import { capturePhoto } from '@/features/photos/ui';
import { PhotosSection } from '@/features/inspections/photos-section';
import { ReadingsSection } from '@/features/inspections/readings-section';
import { type DraftProblem, inspectionTypeLabel, type PhotoRef } from '@/features/records/schema';
import { InspectionFrame } from '@/features/inspections/inspection-frame';
import { jumpTo } from '@/features/inspections/jump-to';
import { type Removed, UNDO_WINDOW_MS, putBack, removedText, takeOut } from '@/features/inspections/removal';
import { SubmitStep, submitAction } from '@/features/inspections/submit-step';
import { unstatedMethodProblems } from '@/features/instruments';
import { useFieldDeclarationQuery, useFieldInstrumentsQuery } from '@/features/instruments/ui';
import { DEFAULT_DECLARATION_TEXT } from '@/features/instruments/schema';
import { measuredSources } from '@/features/loads';
import { ENGINE_VERSION } from '@/features/loads/engine';
import { CycleResults } from '@/features/loads/ui';
import { LoadCheckBasis } from '@/features/records/ui';
import { MeasuredRiderTable, MotionRecorder } from '@/features/motion-recording/ui';
import type { DesignData } from '@/features/loads/design-schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { photoPlaceAllowed, useUnitSystem } from '@/features/settings';
import { useSyncStatus } from '@/features/sync/ui';
import { TapTimer } from '@/features/tap-timer/ui';
import type { UnitSystem } from '@/lib/units';

type Section = 'checklist' | 'readings' | 'photos' | 'result' | 'submit';

const sections: { value: Section; label: string }[] = [
  { value: 'checklist', label: 'Checklist' },
  { value: 'readings', label: 'Readings' },
  { value: 'photos', label: 'Photos' },
  { value: 'result', label: 'Loads' },
  { value: 'submit', label: 'Submit' },
];

/** Where to open the recording: at the readings, with a pivot's card (joint index) in view. */
type OpenAt = { joint: number | null };

/** Recording one inspection on the phone: every change is saved on the device at once. */
export function InspectionScreen({ id, openAt }: { id: string; openAt?: OpenAt }) {
  const draftQuery = useDraftQuery(id);
  const draft = draftQuery.data ?? null;
  const rideQuery = useFieldRideQuery(draft?.rideId ?? null, draft?.designVersionId, draft?.templateId);
  if (draftQuery.isPending || (draft && rideQuery.isPending)) return <FullScreenWait />;
  if (!draft)
    return (
      <Screen title="Inspection not found">
        <Text muted>
          It may have been submitted already. Submitted inspections are in the outbox on Today.
        </Text>
        <Button label="Back to Today" onPress={() => router.replace(todayHref)} />
      </Screen>
    );
  return <Recording draft={draft} data={rideQuery.data ?? null} openAt={openAt} />;
}

type RideData = ReturnType<typeof useFieldRideQuery>['data'];

/** A tapped blocker: the part it is about, and the item to bring into view (`at` tells two taps apart). */
type Jump = { problem: DraftProblem; at: number };

function Recording({ draft, data, openAt }: { draft: Draft; data: RideData | null; openAt?: OpenAt }) {
  const [section, setSection] = useState<Section>(openAt ? 'readings' : 'checklist');
  const [system] = useUnitSystem();
  const editor = useDraftEditor(draft.id);
  const submit = useSubmitDraftMutation();
  const sync = useSyncStatus();
  const { photoBusy, photoError, onCapture } = useDraftPhotoCapture(editor.update);
  const instruments = useFieldInstrumentsQuery();
  const declarationSetting = useFieldDeclarationQuery();
  const user = useSession().data?.user ?? null;
  // Ticked afresh each time the inspector comes to submit: leaving the step withdraws it.
  const [declared, setDeclared] = useState(false);
  const declarationText = declarationSetting.data?.text ?? DEFAULT_DECLARATION_TEXT;
  const design = data?.design?.data ?? null;
  const template = data?.template ?? null;
  const change = editor.update;
  const now = () => new Date();
  const scroll = useRef<ScrollView>(null);
  const targets = useRef(new Map<string, View>());
  const readingsTop = useRef<View>(null);
  const pivots = useRef(new Map<number, View>());
  const scannedJoint = openAt?.joint ?? null;
  // Opened from a pivot's plate: that pivot's card into view, with the focus, once it has rendered.
  useEffect(() => {
    if (scannedJoint === null) return;
    const timer = setTimeout(() => jumpTo(pivots.current.get(scannedJoint) ?? null, scroll.current), 50);
    return () => clearTimeout(timer);
  }, [scannedJoint]);
  const [jump, setJump] = useState<Jump | null>(null);
  const undo = useUndoRemoval(change);

  const result = useLoadCheck(draft, design, template);
  const problems = [...draftProblems(draft, template, design), ...unstatedMethodProblems(draft.readings)];

  const goTo = (next: Section, keep?: Jump) => {
    setDeclared(false);
    setSection(next);
    setJump(keep ?? null);
    if (!keep) scroll.current?.scrollTo({ y: 0, animated: false });
  };
  // After the part a blocker is about has rendered: its item (or the readings) into view, with the focus.
  useEffect(() => {
    if (!jump) return;
    const id = jump.problem.itemId;
    jumpTo(id ? (targets.current.get(id) ?? null) : readingsTop.current, scroll.current);
  }, [jump]);

  const at = sections.findIndex((s) => s.value === section);
  const next = sections[at + 1];
  const previous = sections[at - 1];
  const action = submitAction({
    draft,
    template,
    problems,
    saving: editor.saving,
    user,
    declarationText,
    declared,
    submit,
    syncNow: () => sync.syncNow(),
  });

  return (
    <InspectionFrame
      ref={scroll}
      title={draft.rideName}
      subtitle={`${draft.amendsId ? 'Correction of a returned inspection · ' : ''}${inspectionTypeLabel[draft.type]} · started ${formatLocalStamp(draft.startedAt)}`}
      snackbar={undo.snackbar}
      bar={
        <ActionBar label="Inspection actions">
          <SaveState saving={editor.saving} error={editor.error} step={at + 1} of={sections.length} />
          {previous ? (
            <IconButton
              icon="chevron-left"
              label={`Back to ${previous.label}`}
              onPress={() => goTo(previous.value)}
            />
          ) : null}
          {next ? (
            <Button label={`Next: ${next.label}`} onPress={() => goTo(next.value)} />
          ) : (
            <Button
              label="Submit inspection"
              tone="accent"
              disabled={action.disabled}
              busy={action.busy}
              onPress={() => void action.run()}
            />
          )}
        </ActionBar>
      }
    >
      <ProgressLine draft={draft} />
      <StepTabs<Section>
        label="Part of the inspection"
        value={section}
        onChange={(s) => goTo(s)}
        steps={stepsOf(draft, problems)}
      />
      {editor.error ? (
        <Text role="alert" color={colors.danger}>
          {editor.error.message}
        </Text>
      ) : null}

      {photoError && section !== 'photos' ? (
        <Text role="alert" color={colors.danger}>
          {photoError}
        </Text>
      ) : null}
      {section === 'checklist' ? (
        <ChecklistSection
          draft={draft}
          template={template}
          system={system}
          onAnswer={(itemId, patch) => change((d) => answerItem(d, itemId, patch, now()))}
          onPhoto={(itemId) => void onCapture('camera', { checklistItemId: itemId })}
          design={design}
          instruments={instruments.data ?? []}
          onDraft={change}
          Thumb={PhotoThumb}
          itemRef={(itemId, node) =>
            node ? targets.current.set(itemId, node) : targets.current.delete(itemId)
          }
          pointedAt={jump?.problem.itemId ? jump.problem : null}
        />
      ) : null}
      {section === 'readings' ? (
        <View ref={readingsTop} tabIndex={-1} accessibilityLabel="Readings" style={styles.part}>
          <ReadingsSection
            draft={draft}
            design={design}
            system={system}
            onAdd={(r) => change((d) => addReading(d, r, now()))}
            onRemove={(rid) => undo.remove('reading', rid)}
            instruments={instruments.data ?? []}
            renderTimer={(onUse, per) => <TapTimer per={per} onUse={(t) => onUse(t.periodS, t.spreadS)} />}
            pivotRef={(joint, node) =>
              node ? pivots.current.set(joint, node) : pivots.current.delete(joint)
            }
            scannedJoint={scannedJoint}
          />
          {jump && !jump.problem.itemId ? <Text color={colors.near}>{jump.problem.message}</Text> : null}
        </View>
      ) : null}
      {section === 'readings' && design ? (
        <MotionRecorder
          design={design}
          readings={draft.readings}
          records={draft.motionRecords ?? []}
          system={system}
          onKeep={(r) => change((d) => putMotionRecord(d, r, now()))}
          onRemove={(rid) => change((d) => removeMotionRecord(d, rid, now()))}
        />
      ) : null}
      {section === 'photos' ? (
        <PhotosSection
          draft={draft}
          design={design}
          Thumb={PhotoThumb}
          onCapture={(source) => void onCapture(source)}
          onUpdate={(pid, patch) => change((d) => updatePhoto(d, pid, patch, now()))}
          onRemove={(pid) => undo.remove('photo', pid)}
          busy={photoBusy}
          error={photoError}
          photoItems={
            new Set(
              (template?.version.content.areas ?? []).flatMap((a) =>
                a.items.filter((i) => i.photoRequired).map((i) => i.id),
              ),
            )
          }
        />
      ) : null}
      {section === 'result' ? (
        <LoadCheck result={result} design={design} draft={draft} system={system} />
      ) : null}
      {section === 'submit' ? (
        <SubmitStep
          draft={draft}
          problems={problems}
          onNotes={(t) => change((d) => setNotes(d, t, now()))}
          user={user}
          declarationText={declarationText}
          fromDefault={declarationSetting.isSuccess && !declarationSetting.data}
          declared={declared}
          setDeclared={setDeclared}
          submit={submit}
          onProblem={(problem) =>
            goTo(problem.itemId ? 'checklist' : 'readings', { problem, at: Date.now() })
          }
        />
      ) : null}
    </InspectionFrame>
  );
}

/** Each step's state in a word or a count, so the row says where work is left. */
function stepsOf(draft: Draft, problems: DraftProblem[]): Step<Section>[] {
  const p = draftProgress(draft);
  return sections.map((s) => {
    switch (s.value) {
      case 'checklist':
        return { ...s, detail: `${p.answered}/${p.total}`, attention: p.answered < p.total };
      case 'readings':
        return { ...s, detail: String(p.readings) };
      case 'photos':
        return { ...s, detail: String(p.photos) };
      case 'submit':
        return problems.length > 0
          ? { ...s, detail: `${problems.length} to do`, attention: true }
          : { ...s, detail: 'ready' };
      default:
        return s;
    }
  });
}

/** Removals of photos and readings, saved at once and offered back for a while (features/inspections/removal). */
function useUndoRemoval(change: (update: (d: Draft) => Draft) => void) {
  const [last, setLast] = useState<{ removed: Removed; token: string } | null>(null);
  const remove = (kind: Removed['kind'], id: string) => {
    const out: { removed?: Removed } = {};
    change((d) => {
      const taken = takeOut(d, kind, id, new Date());
      if (!taken) return d;
      out.removed = taken.removed;
      return taken.draft;
    });
    if (out.removed) setLast({ removed: out.removed, token: randomUUID() });
  };
  const snackbar = last ? (
    <UndoSnackbar
      message={removedText(last.removed)}
      token={last.token}
      windowMs={UNDO_WINDOW_MS}
      onUndo={() => {
        change((d) => putBack(d, last.removed, new Date()));
        setLast(null);
      }}
      onExpire={() => setLast(null)}
    />
  ) : null;
  return { remove, snackbar };
}

/** What is done so far. */
function ProgressLine({ draft }: { draft: Draft }) {
  const progress = draftProgress(draft);
  return (
    <View style={styles.progress} accessibilityLabel="Progress">
      <Text variant="small">
        {progress.answered}/{progress.total} answered · {progress.failed} failed · {progress.readings}{' '}
        readings · {progress.photos} photos
      </Text>
    </View>
  );
}

/** Whether the last change is saved on the phone, and where in the inspection the inspector is. */
function SaveState({
  saving,
  error,
  step,
  of,
}: {
  saving: boolean;
  error: Error | null;
  step: number;
  of: number;
}) {
  return (
    <View style={styles.saveState}>
      <Text
        variant="small"
        color={error ? colors.danger : colors.text}
        accessibilityLiveRegion="polite"
        numberOfLines={1}
      >
        {error ? 'Not saved — see above' : saving ? 'Saving…' : 'Saved on this phone'}
      </Text>
      <Text variant="small" muted numberOfLines={1}>
        Step {step} of {of}
      </Text>
    </View>
  );
}

/** The phone's load check of the record so far, or why it cannot run. */
function LoadCheck({
  result,
  design,
  draft,
  system,
}: {
  result: ReturnType<typeof useLoadCheck>;
  design: DesignData | null;
  draft: Draft;
  system: UnitSystem;
}) {
  return result ? (
    <>
      <CycleResults
        result={result}
        system={system}
        xAxis={result.joints[0] && design?.motion[0]?.kind === 'constant' ? 'angle' : 'time'}
        sources={measuredSources(draft)}
        cases={
          result.loadCases.length > 1 ? { cases: result.loadCases, governing: result.governingCase } : null
        }
      />
      <Card>
        <LoadCheckBasis
          models={result.models}
          periodChecks={result.periodChecks}
          engineVersion={ENGINE_VERSION}
          system={system}
        />
      </Card>
      {design ? (
        <MeasuredRiderTable
          measured={measuredRiderOf(design, draft.motionRecords)}
          computed={result.seats.map((s) => ({
            name: s.name,
            gxMin: s.extremes.gx.min,
            gxMax: s.extremes.gx.max,
            gzMin: s.extremes.gz.min,
            gzMax: s.extremes.gz.max,
          }))}
          system={system}
        />
      ) : null}
    </>
  ) : (
    <Card>
      <Text muted>
        No design data for this ride on the phone: the load check cannot run. Sync, then try again.
      </Text>
    </Card>
  );
}

/** The load check follows every reading, on the phone, so the inspector knows before leaving the ride. */
function useLoadCheck(draft: Draft, design: DesignData | null, template: ChecklistTemplate | null) {
  return useMemo(() => {
    if (!design) return null;
    try {
      const content = template?.version.version === draft.templateVersion ? template.version.content : null;
      const record = {
        readings: draft.readings,
        checklist: draft.checklist,
        motionRecords: draft.motionRecords,
      };
      return analyseRecord(design, record, content, 360);
    } catch {
      return null;
    }
  }, [design, draft.readings, draft.checklist, draft.motionRecords, draft.templateVersion, template]);
}

/**
 * Takes or picks a photo, keeps its bytes on the phone under their hash and adds it to the draft (tied
 * to a checklist item when one asks for it).
 */
function useDraftPhotoCapture(change: (update: (d: Draft) => Draft) => void) {
  const dev = useDeviceDb();
  const [photoBusy, setPhotoBusy] = useState(false);
  const [photoError, setPhotoError] = useState<string | null>(null);
  const now = () => new Date();
  const onCapture = async (source: 'camera' | 'library', link: { checklistItemId?: string } = {}) => {
    setPhotoError(null);
    setPhotoBusy(true);
    try {
      const shot = await capturePhoto(source, { allowPlace: photoPlaceAllowed() });
      if (!shot) return;
      const bytes = toByteArray(shot.base64);
      const { sha256 } = await putPhotoBlob(dev, { bytes, mime: shot.mime });
      const ref: PhotoRef = {
        id: randomUUID(),
        sha256,
        mime: shot.mime,
        bytes: bytes.length,
        caption: '',
        joint: null,
        checklistItemId: link.checklistItemId ?? null,
        ...shot.facts,
      };
      change((d) => addPhoto(d, ref, now()));
    } catch (err) {
      setPhotoError(err instanceof Error ? err.message : 'The photo could not be kept.');
    } finally {
      setPhotoBusy(false);
    }
  };

  return { photoBusy, photoError, onCapture };
}

/** A photo from the device store, as a square of `size` px (112 in the photo list). */
function PhotoThumb({ photo, size = 112, label }: { photo: PhotoRef; size?: number; label?: string }) {
  const uri = usePhotoUriQuery(photo.sha256);
  return (
    <Image
      source={{ uri: uri.data ?? undefined }}
      style={[styles.thumb, { width: size, height: size }]}
      accessibilityLabel={label ?? (photo.caption || 'Photo')}
    />
  );
}

const styles = StyleSheet.create({
  part: { gap: space.md },
  saveState: { flex: 1, minWidth: 0 },
  progress: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    justifyContent: 'space-between',
    gap: space.sm,
    backgroundColor: colors.surface,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    padding: space.md,
  },
  thumb: { borderRadius: radius.md, backgroundColor: colors.surfaceSunk },
});
