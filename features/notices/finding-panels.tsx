import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { toByteArray } from 'base64-js';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { space } from '@/components/theme';
import { problemText } from '@/features/notices/corrective-action-form';
import { FindingFormFrame } from '@/features/notices/finding-form-frame';
import { putEvidencePhoto, useCloseFinding, useReopenFinding } from '@/features/notices/notices-api';
import {
  type FindingStateResponse,
  type NoticeFinding,
  findingCloseInputSchema,
  findingReopenInputSchema,
} from '@/features/notices/schema';
import { capturePhoto } from '@/features/photos/ui';

/* The verifier's forms on a finding: verify and close it, or reopen it with a comment. */

export type PanelProps = {
  noticeId: string;
  finding: NoticeFinding;
  userName: string;
  onDone: (answer: FindingStateResponse) => void;
  onCancel: () => void;
};

/**
 * Closing takes the verifier's note and evidence (the status rules): a document reference typed here, or
 * the operator's corrective-action report already on the finding. Closing never returns the ride to
 * service; the last finding that forbids operation closed books the ride's follow-up inspection.
 */
export function ClosePanel({ noticeId, finding, userName, onDone, onCancel }: PanelProps) {
  const change = useCloseFinding(noticeId, userName);
  const [note, setNote] = useState('');
  const [evidenceRef, setEvidenceRef] = useState('');
  const [errors, setErrors] = useState<{ note?: string; evidence?: string }>({});
  // Photos taken at the verification, uploaded under their SHA-256 as soon as they are picked.
  const [shots, setShots] = useState<{ sha256: string; state: 'uploading' | 'uploaded' | 'failed' }[]>([]);
  const reports = finding.correctiveActions.length;
  const uploaded = shots.filter((p) => p.state === 'uploaded').map((p) => p.sha256);
  const title = `Verify and close finding ${finding.number}`;
  const addPhoto = async (source: 'camera' | 'library') => {
    const shot = await capturePhoto(source).catch(() => null);
    if (!shot) return;
    const bytes = toByteArray(shot.base64);
    const hash = bytesToHex(sha256(bytes));
    if (shots.some((p) => p.sha256 === hash)) return;
    const mark = (state: 'uploaded' | 'failed') =>
      setShots((list) => list.map((p) => (p.sha256 === hash ? { ...p, state } : p)));
    setShots((list) => [...list, { sha256: hash, state: 'uploading' }]);
    setErrors((e) => ({ ...e, evidence: undefined }));
    await putEvidencePhoto({ sha256: hash, mime: shot.mime, bytes }).then(
      () => mark('uploaded'),
      () => mark('failed'),
    );
  };
  const submit = () => {
    if (shots.some((p) => p.state === 'uploading')) return;
    const checked = findingCloseInputSchema.safeParse({ note, evidenceRef, photoShas: uploaded });
    const noteError = checked.success
      ? undefined
      : checked.error.issues.find((i) => i.path[0] === 'note')?.message;
    const evidenceError =
      evidenceRef.trim() === '' && reports === 0 && uploaded.length === 0
        ? 'Add a photo or a document reference, or wait for the operator’s corrective-action report.'
        : undefined;
    if (!checked.success || evidenceError) {
      setErrors({ note: noteError, evidence: evidenceError });
      return;
    }
    change.mutate({ findingId: finding.id, input: checked.data }, { onSuccess: onDone });
  };
  return (
    <FindingFormFrame
      label={title}
      title={title}
      intro="Close it once you have checked that the deficiency is put right. Closing does not return the ride to service: when this is its last finding that forbids operation, a follow-up inspection is booked, and its approval does."
      problem={change.error ? { message: problemText(change.error) } : null}
      submitLabel="Close finding"
      submitTone="accent"
      onSubmit={submit}
      busy={change.isPending}
      onCancel={onCancel}
    >
      <TextField
        label="Verification note"
        value={note}
        onChangeText={(t) => {
          setNote(t);
          setErrors((e) => ({ ...e, note: undefined }));
        }}
        multiline
        error={errors.note}
        hint="What you checked and found: seen on site, measured, tested…"
      />
      <TextField
        label={reports > 0 ? 'Evidence reference (optional)' : 'Evidence reference'}
        value={evidenceRef}
        onChangeText={(t) => {
          setEvidenceRef(t);
          setErrors((e) => ({ ...e, evidence: undefined }));
        }}
        error={errors.evidence}
        hint={
          reports > 0
            ? `The operator’s corrective-action report${reports > 1 ? 's' : ''} (${reports}) on this finding count as evidence; add a work order, NDT or maker’s report number if you have one.`
            : 'A work order, NDT or maker’s report number. Or add a photo of the corrected part, or wait for the operator’s corrective-action report.'
        }
      />
      <View style={styles.buttons}>
        <Button label="Take a photo" tone="quiet" onPress={() => void addPhoto('camera')} />
        <Button label="Choose from library" tone="quiet" onPress={() => void addPhoto('library')} />
      </View>
      {shots.length > 0 ? (
        <Text variant="small" accessibilityLiveRegion="polite">
          {shots
            .map(
              (p, i) =>
                `Photo ${i + 1}: ${p.state === 'uploaded' ? '✓ uploaded' : p.state === 'failed' ? 'not uploaded, add it again' : 'uploading…'}`,
            )
            .join(' · ')}
        </Text>
      ) : null}
    </FindingFormFrame>
  );
}

/** Reopening takes the verifier's comment on what is still wrong; the operator sees it. */
export function ReopenPanel({ noticeId, finding, userName, onDone, onCancel }: PanelProps) {
  return (
    <NotePanel
      title={`Reopen finding ${finding.number}`}
      intro="The operator sees your comment. A reopened finding that forbids operation takes a ride in service out of service."
      noteLabel="What is still wrong"
      submitLabel="Reopen finding"
      submitTone="danger"
      schema={findingReopenInputSchema}
      change={useReopenFinding(noticeId, userName)}
      finding={finding}
      onDone={onDone}
      onCancel={onCancel}
    />
  );
}

/** The part of a finding change (close or reopen) the panel uses. */
type NoteChange<I> = {
  mutate: (
    change: { findingId: string; input: I },
    options: { onSuccess: (answer: FindingStateResponse) => void },
  ) => void;
  isPending: boolean;
  error: unknown;
};

/** A verifier's form for closing or reopening a finding: a note checked by the schema, then sent. */
function NotePanel<I>({
  title,
  intro,
  noteLabel,
  noteHint,
  submitLabel,
  submitTone,
  schema,
  change,
  finding,
  onDone,
  onCancel,
}: {
  title: string;
  intro: string;
  noteLabel: string;
  noteHint?: string;
  submitLabel: string;
  submitTone: 'accent' | 'danger';
  schema: z.ZodType<I>;
  change: NoteChange<I>;
  finding: NoticeFinding;
  onDone: (answer: FindingStateResponse) => void;
  onCancel: () => void;
}) {
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | undefined>();
  const submit = () => {
    const checked = schema.safeParse({ note });
    if (!checked.success) {
      setError(checked.error.issues[0]?.message);
      return;
    }
    change.mutate({ findingId: finding.id, input: checked.data }, { onSuccess: onDone });
  };
  return (
    <FindingFormFrame
      label={title}
      title={title}
      intro={intro}
      problem={change.error ? { message: problemText(change.error) } : null}
      submitLabel={submitLabel}
      submitTone={submitTone}
      onSubmit={submit}
      busy={change.isPending}
      onCancel={onCancel}
    >
      <TextField
        label={noteLabel}
        value={note}
        onChangeText={(t) => {
          setNote(t);
          setError(undefined);
        }}
        multiline
        error={error}
        hint={noteHint}
      />
    </FindingFormFrame>
  );
}

const styles = StyleSheet.create({
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
