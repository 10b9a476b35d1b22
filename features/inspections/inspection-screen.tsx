import { toByteArray } from 'base64-js';
import { randomUUID } from 'expo-crypto';
import { router } from 'expo-router';
import { useMemo, useState } from 'react';
import { Image, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FullScreenWait } from '@/components/full-screen-wait';
import { Screen } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { useSession } from '@/features/auth/api';
import { useDeviceDb } from '@/features/device-db/provider';
import { putPhotoBlob } from '@/features/device-db/photos';
import { analyseRecord } from '@/features/inspections/analysis';
import { ChecklistSection } from '@/features/inspections/checklist-section';
import {
  type Draft,
  addPhoto,
  addReading,
  answerItem,
  draftProblems,
  draftProgress,
  removePhoto,
  removeReading,
  setNotes,
  updatePhoto,
} from '@/features/inspections/draft';
import {
  useDraftQuery,
  useFieldRideQuery,
  usePhotoUriQuery,
  useDraftEditor,
  useSubmitDraftMutation,
} from '@/features/inspections/field-api';
import { capturePhoto } from '@/features/photos/photo-capture';
import { PhotosSection } from '@/features/inspections/photos-section';
import { ReadingsSection } from '@/features/inspections/readings-section';
import { inspectionTypeLabel, type PhotoRef } from '@/features/inspections/schema';
import { DeclarationConfirm } from '@/features/instruments/declaration-confirm';
import { useFieldDeclarationQuery, useFieldInstrumentsQuery } from '@/features/instruments/field-api';
import { DEFAULT_DECLARATION_TEXT } from '@/features/instruments/schema';
import { unstatedMethodProblems } from '@/features/instruments/unstated';
import { CycleResults } from '@/features/loads/cycle-results';
import { measuredSources } from '@/features/loads/format';
import { useUnitSystem } from '@/features/settings/unit-system';
import { useSyncStatus } from '@/features/sync/use-sync-status';
import { TapTimer } from '@/features/tap-timer/tap-timer';

type Section = 'checklist' | 'readings' | 'photos' | 'result' | 'submit';

/** Recording one inspection on the phone: every change is saved on the device at once. */
export function InspectionScreen({ id }: { id: string }) {
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
        <Button label="Back to Today" onPress={() => router.replace('/today')} />
      </Screen>
    );
  return <Recording draft={draft} data={rideQuery.data ?? null} />;
}

type RideData = ReturnType<typeof useFieldRideQuery>['data'];

function Recording({ draft, data }: { draft: Draft; data: RideData | null }) {
  const [section, setSection] = useState<Section>('checklist');
  const [system] = useUnitSystem();
  const editor = useDraftEditor(draft.id);
  const submit = useSubmitDraftMutation();
  const sync = useSyncStatus();
  const dev = useDeviceDb();
  const [photoBusy, setPhotoBusy] = useState(false);
  const [photoError, setPhotoError] = useState<string | null>(null);
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

  // The load check follows every reading, on the phone, so the inspector knows before leaving the ride.
  const result = useMemo(() => {
    if (!design) return null;
    try {
      const content = template?.version.version === draft.templateVersion ? template.version.content : null;
      return analyseRecord(design, { readings: draft.readings, checklist: draft.checklist }, content, 360);
    } catch {
      return null;
    }
  }, [design, draft.readings, draft.checklist, draft.templateVersion, template]);
  const problems = [...draftProblems(draft, template, design), ...unstatedMethodProblems(draft.readings)];
  const progress = draftProgress(draft);

  const onCapture = async (source: 'camera' | 'library', link: { checklistItemId?: string } = {}) => {
    setPhotoError(null);
    setPhotoBusy(true);
    try {
      const shot = await capturePhoto(source);
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
        takenAt: new Date().toISOString(),
      };
      change((d) => addPhoto(d, ref, now()));
    } catch (err) {
      setPhotoError(err instanceof Error ? err.message : 'The photo could not be kept.');
    } finally {
      setPhotoBusy(false);
    }
  };

  return (
    <Screen
      title={draft.rideName}
      subtitle={`${draft.amendsId ? 'Correction of a returned inspection · ' : ''}${inspectionTypeLabel[draft.type]} · started ${new Date(draft.startedAt).toLocaleString('en-GB')}`}
    >
      <View style={styles.progress} accessibilityLabel="Progress">
        <Text variant="small">
          {progress.answered}/{progress.total} answered · {progress.failed} failed · {progress.readings}{' '}
          readings · {progress.photos} photos
        </Text>
        <Text
          variant="small"
          color={editor.error ? colors.danger : colors.textMuted}
          accessibilityLiveRegion="polite"
        >
          {editor.error ? 'Not saved — see below' : editor.saving ? 'Saving…' : 'Saved on this phone'}
        </Text>
      </View>
      <Segmented<Section>
        label="Part of the inspection"
        value={section}
        onChange={(next) => {
          setDeclared(false);
          setSection(next);
        }}
        options={[
          { value: 'checklist', label: 'Checklist' },
          { value: 'readings', label: 'Readings' },
          { value: 'photos', label: 'Photos' },
          { value: 'result', label: 'Loads' },
          { value: 'submit', label: 'Submit' },
        ]}
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
        />
      ) : null}
      {section === 'readings' ? (
        <ReadingsSection
          draft={draft}
          design={design}
          system={system}
          onAdd={(r) => change((d) => addReading(d, r, now()))}
          onRemove={(rid) => change((d) => removeReading(d, rid, now()))}
          instruments={instruments.data ?? []}
          renderTimer={(onUse, per) => <TapTimer per={per} onUse={(t) => onUse(t.periodS, t.spreadS)} />}
        />
      ) : null}
      {section === 'photos' ? (
        <PhotosSection
          draft={draft}
          design={design}
          Thumb={PhotoThumb}
          onCapture={(source) => void onCapture(source)}
          onUpdate={(pid, patch) => change((d) => updatePhoto(d, pid, patch, now()))}
          onRemove={(pid) => change((d) => removePhoto(d, pid, now()))}
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
        result ? (
          <CycleResults
            result={result}
            system={system}
            xAxis={result.joints[0] && design?.motion[0]?.kind === 'constant' ? 'angle' : 'time'}
            sources={measuredSources(draft)}
          />
        ) : (
          <Card>
            <Text muted>
              No design data for this ride on the phone: the load check cannot run. Sync, then try again.
            </Text>
          </Card>
        )
      ) : null}
      {section === 'submit' ? (
        <View style={styles.submit}>
          <TextField
            label="Notes for the supervisor"
            value={draft.notes}
            onChangeText={(t) => change((d) => setNotes(d, t, now()))}
            multiline
          />
          {problems.length > 0 ? (
            <Card>
              <Text variant="heading">Before you submit</Text>
              {problems.map((p, i) => (
                <Text key={`${p.itemId}${i}`} color={colors.near}>
                  • {p.message}
                </Text>
              ))}
            </Card>
          ) : (
            <Card>
              <Text variant="heading">Ready to submit</Text>
              <Text muted>
                It goes to the outbox on this phone and is sent as soon as there is a connection. After that
                it cannot be changed; a correction is sent as an amendment.
              </Text>
            </Card>
          )}
          {user ? (
            <DeclarationConfirm
              text={declarationText}
              name={user.name}
              value={declared}
              onChange={setDeclared}
              fromDefault={declarationSetting.isSuccess && !declarationSetting.data}
            />
          ) : null}
          {submit.isError ? (
            <Text role="alert" color={colors.danger}>
              {(submit.error as Error).message}
            </Text>
          ) : null}
          <Button
            label="Submit inspection"
            tone="accent"
            disabled={problems.length > 0 || editor.saving || !declared || !user}
            busy={submit.isPending}
            onPress={async () => {
              if (!declared || !user) return;
              try {
                await submit.mutateAsync({
                  draft,
                  template,
                  declaration: {
                    text: declarationText,
                    declaredAt: new Date().toISOString(),
                    declaredBy: user.id,
                    declaredByName: user.name,
                  },
                });
              } catch {
                return; // shown above from submit.error
              }
              void sync.syncNow();
              router.replace('/today');
            }}
          />
        </View>
      ) : null}
    </Screen>
  );
}

function PhotoThumb({ photo }: { photo: PhotoRef }) {
  const uri = usePhotoUriQuery(photo.sha256);
  return (
    <Image
      source={{ uri: uri.data ?? undefined }}
      style={styles.thumb}
      accessibilityLabel={photo.caption || 'Photo'}
    />
  );
}

const styles = StyleSheet.create({
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
  submit: { gap: space.lg },
  thumb: { width: 112, height: 112, borderRadius: radius.md, backgroundColor: colors.surfaceSunk },
});
