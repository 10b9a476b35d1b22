import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { toByteArray } from 'base64-js';
import { useRef, useState } from 'react';
import { Image, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { type FormProblem } from '@/components/form-alert';
import { IconButton } from '@/components/icon-button';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { capturePhoto } from '@/features/photos/ui';
import { putEvidencePhoto, useReportAction } from '@/features/notices/notices-api';
import { type NoticeFinding, correctiveActionInputSchema } from '@/features/notices/schema';
import { FindingFormFrame } from '@/features/notices/finding-form-frame';

/** The schema's own limit on photos per action. */
const MAX_PHOTOS = 12;

export type Picked = {
  sha256: string;
  mime: string;
  base64: string;
  bytes: Uint8Array;
  status: 'uploading' | 'uploaded' | 'failed';
  error: string | null;
};

export function problemText(err: unknown): string {
  if (err instanceof OfflineError)
    return 'No connection. What you wrote and the photos stay here; send again when you have signal.';
  if (err instanceof ApiRequestError) return err.message;
  if (err instanceof Error) return err.message;
  return 'Something went wrong. Try again.';
}

/**
 * The operator's report of what was done about one finding: a note and evidence photos. Each photo is
 * taken or chosen, compressed on the device, hashed (SHA-256) and uploaded under its hash straight away;
 * the action is sent once every photo is on the server, naming the photos by hash.
 */
export function CorrectiveActionForm({
  noticeId,
  finding,
  userName,
  onDone,
  onCancel,
}: {
  noticeId: string;
  finding: NoticeFinding;
  userName: string;
  onDone: () => void;
  onCancel: () => void;
}) {
  const report = useReportAction(noticeId, userName);
  const [note, setNote] = useState('');
  const [noteError, setNoteError] = useState<string | undefined>();
  const [problem, setProblem] = useState<FormProblem | null>(null);
  const [sending, setSending] = useState(false);
  const { photos, setPhotos, picking, upload, pick, remove } = useEvidencePhotos(setProblem);

  const submit = async () => {
    setProblem(null);
    const input = { note, photoShas: photos.map((p) => p.sha256) };
    const checked = correctiveActionInputSchema.safeParse(input);
    if (!checked.success) {
      const noteIssue = checked.error.issues.find((i) => i.path[0] === 'note');
      setNoteError(noteIssue?.message);
      const other = checked.error.issues.filter((i) => i.path[0] !== 'note');
      if (other.length > 0) setProblem({ message: other[0].message });
      return;
    }
    setNoteError(undefined);
    setSending(true);
    try {
      try {
        // One at a time: a phone on a weak signal does better with one stream.
        for (const p of photos) await upload(p);
      } catch (err) {
        setProblem({
          message: 'A photo could not be uploaded, so nothing was sent.',
          details: [problemText(err), 'Try again, or remove that photo.'],
        });
        return;
      }
      await report.mutateAsync({ findingId: finding.id, input: checked.data });
      setNote('');
      setPhotos([]);
      onDone();
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues.length > 0) {
        const noteIssue = err.issues.find((i) => i.path === 'note');
        if (noteIssue) setNoteError(noteIssue.message);
        setProblem({
          message: err.message,
          details: err.issues
            .filter((i) => i.path !== 'note')
            .map((i) => {
              const index = /^photoShas\.(\d+)$/.exec(i.path);
              return index ? `Photo ${Number(index[1]) + 1}: ${i.message}` : i.message;
            }),
        });
      } else setProblem({ message: problemText(err) });
    } finally {
      setSending(false);
    }
  };

  return (
    <FindingFormFrame
      label={`Corrective action for finding ${finding.number}`}
      title="Report corrective action"
      problem={problem}
      submitLabel="Send corrective action"
      submitTone="accent"
      onSubmit={submit}
      busy={sending}
      onCancel={onCancel}
    >
      <TextField
        label="What was done"
        value={note}
        onChangeText={(t) => {
          setNote(t);
          if (noteError) setNoteError(undefined);
        }}
        multiline
        numberOfLines={4}
        style={styles.note}
        error={noteError}
        hint="What was repaired or replaced, by whom, and how it was checked."
      />
      <EvidencePhotos
        photos={photos}
        picking={picking}
        sending={sending}
        onPick={pick}
        onRetry={(p) => upload(p).catch(() => undefined)}
        onRemove={remove}
      />
    </FindingFormFrame>
  );
}

/**
 * The evidence photos of one action: each is taken or chosen, compressed on the device, hashed (SHA-256)
 * and its upload started at once; the form's send waits for every upload.
 */
export function useEvidencePhotos(setProblem: (problem: FormProblem | null) => void) {
  const [photos, setPhotos] = useState<Picked[]>([]);
  const [picking, setPicking] = useState(false);
  const uploads = useRef(new Map<string, Promise<void>>());

  const mark = (sha: string, change: Partial<Picked>) =>
    setPhotos((list) => list.map((p) => (p.sha256 === sha ? { ...p, ...change } : p)));

  /** Uploads a photo once; a failed upload is forgotten so the next try sends it again. */
  const upload = (photo: Pick<Picked, 'sha256' | 'mime' | 'bytes'>): Promise<void> => {
    let job = uploads.current.get(photo.sha256);
    if (!job) {
      mark(photo.sha256, { status: 'uploading', error: null });
      job = putEvidencePhoto(photo).then(
        () => mark(photo.sha256, { status: 'uploaded', error: null }),
        (err: unknown) => {
          uploads.current.delete(photo.sha256);
          mark(photo.sha256, { status: 'failed', error: problemText(err) });
          throw err;
        },
      );
      uploads.current.set(photo.sha256, job);
    }
    return job;
  };

  const pick = async (source: 'camera' | 'library') => {
    setProblem(null);
    setPicking(true);
    try {
      const shot = await capturePhoto(source);
      if (!shot) return;
      const bytes = toByteArray(shot.base64);
      const hash = bytesToHex(sha256(bytes));
      if (photos.some((p) => p.sha256 === hash)) {
        setProblem({ message: 'That photo is already attached.' });
        return;
      }
      const photo: Picked = {
        sha256: hash,
        mime: shot.mime,
        base64: shot.base64,
        bytes,
        status: 'uploading',
        error: null,
      };
      setPhotos((list) => [...list, photo]);
      // Started now so it is up by the time the note is written; the send waits for it.
      upload(photo).catch(() => undefined);
    } catch (err) {
      setProblem({ message: `The photo could not be used: ${problemText(err)}` });
    } finally {
      setPicking(false);
    }
  };

  const remove = (sha: string) => setPhotos((list) => list.filter((p) => p.sha256 !== sha));

  return { photos, setPhotos, picking, upload, pick, remove };
}

/** Buttons to add evidence photos, and each photo with its upload state, a retry and a remove. */
export function EvidencePhotos({
  photos,
  picking,
  sending,
  onPick,
  onRetry,
  onRemove,
}: {
  photos: Picked[];
  picking: boolean;
  sending: boolean;
  onPick: (source: 'camera' | 'library') => void;
  onRetry: (photo: Picked) => void;
  onRemove: (sha: string) => void;
}) {
  const full = photos.length >= MAX_PHOTOS;
  return (
    <>
      <View style={styles.pickRow}>
        <Button
          label="Take a photo"
          tone="quiet"
          icon={<Feather name="camera" size={18} color={colors.text} />}
          onPress={() => onPick('camera')}
          disabled={picking || sending || full}
        />
        <Button
          label="Choose from library"
          tone="quiet"
          icon={<Feather name="image" size={18} color={colors.text} />}
          onPress={() => onPick('library')}
          disabled={picking || sending || full}
        />
      </View>
      {full ? (
        <Text variant="small" muted>
          At most {MAX_PHOTOS} photos.
        </Text>
      ) : null}
      {photos.length > 0 ? (
        <View style={styles.photos} role="list" accessibilityLabel={`Evidence photos (${photos.length})`}>
          {photos.map((p, i) => (
            <View key={p.sha256} style={styles.photo} role="listitem" accessibilityLabel={`Photo ${i + 1}`}>
              <Image
                source={{ uri: `data:${p.mime};base64,${p.base64}` }}
                style={styles.preview}
                accessibilityIgnoresInvertColors
              />
              <View style={styles.photoText}>
                <Text variant="label">Photo {i + 1}</Text>
                <Text
                  variant="small"
                  color={p.status === 'failed' ? colors.danger : colors.textMuted}
                  accessibilityLiveRegion="polite"
                >
                  {p.status === 'uploading'
                    ? 'Uploading…'
                    : p.status === 'uploaded'
                      ? '✓ Uploaded'
                      : `Upload failed: ${p.error ?? 'try again'}`}
                </Text>
                {p.status === 'failed' ? (
                  <Button label="Try again" tone="quiet" onPress={() => onRetry(p)} disabled={sending} />
                ) : null}
              </View>
              <IconButton
                icon="trash-2"
                tone="danger"
                label={`Remove photo ${i + 1}`}
                onPress={() => onRemove(p.sha256)}
                disabled={sending}
              />
            </View>
          ))}
        </View>
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  note: { minHeight: 96, textAlignVertical: 'top' },
  pickRow: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  photos: { gap: space.sm },
  photo: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  preview: { width: 72, height: 72, borderRadius: radius.sm, backgroundColor: colors.surfaceSunk },
  photoText: { flex: 1, gap: 2, alignItems: 'flex-start' },
});
