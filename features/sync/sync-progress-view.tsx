import { StyleSheet, View } from 'react-native';

import { ProgressBar, ofText, percentText } from '@/components/progress-bar';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { formatBytes } from '@/lib/bytes';
import type { StepState, SyncProgress } from '@/features/sync/sync-progress';

type Tone = 'active' | 'stopped' | 'done';
const toneOf = (state: StepState): Tone =>
  state === 'stopped' ? 'stopped' : state === 'done' ? 'done' : 'active';

/** The send step's read-out: records of those due, and the batch when there is more than one. */
export function sendText(p: SyncProgress['send']): string {
  if (p.records.total === 0) return p.state === 'waiting' ? 'not started' : 'nothing to send';
  const batches =
    p.batches.total > 1
      ? ` · batch ${Math.min(p.batches.done + 1, p.batches.total)} of ${p.batches.total}`
      : '';
  return `${ofText(p.records.done, p.records.total, 'inspection')}${p.state === 'running' ? batches : ''}`;
}

/** The photo step's read-out: photos of those due and their bytes. */
export function photosText(p: SyncProgress['photos']): string {
  if (p.photos.total === 0) return p.state === 'waiting' ? 'not started' : 'no photos to send';
  return `${ofText(p.photos.done, p.photos.total, 'photo')} · ${formatBytes(p.bytes.done)} of ${formatBytes(p.bytes.total)}`;
}

/** The update's read-out: pages as they come (their number is not known ahead). */
export function updateText(p: SyncProgress['update']): string {
  if (p.state === 'waiting') return 'not started';
  if (p.state === 'done') return 'up to date';
  return p.pages === 0 ? 'asking the server' : `${p.pages} part${p.pages === 1 ? '' : 's'} received`;
}

/**
 * A sync run step by step while it runs, and where a stopped run stopped: inspections sent, photos
 * uploaded (overall by bytes, and the photo going up now), the server's update. A finished run shows
 * nothing (the panel's headline says where things stand).
 */
export function SyncProgressView({ progress }: { progress: SyncProgress | null | undefined }) {
  if (!progress || progress.outcome === 'finished') return null;
  const { send, photos, update } = progress;
  const current = photos.current;
  return (
    <View style={styles.box} accessibilityLabel="Sync progress">
      {send.records.total > 0 || send.state === 'stopped' ? (
        <ProgressBar
          label="Sending inspections"
          value={send.records.done}
          max={Math.max(1, send.records.total)}
          valueText={sendText(send)}
          tone={toneOf(send.state)}
        />
      ) : null}
      {photos.photos.total > 0 || photos.state === 'stopped' ? (
        <ProgressBar
          label="Uploading photos"
          // Bytes, so a large photo moves the bar as it goes; the read-out counts photos too.
          value={photos.bytes.total > 0 ? photos.bytes.done : photos.photos.done}
          max={photos.bytes.total > 0 ? photos.bytes.total : Math.max(1, photos.photos.total)}
          valueText={photosText(photos)}
          tone={toneOf(photos.state)}
        />
      ) : null}
      {current && photos.state === 'running' ? (
        <ProgressBar
          label={`Photo ${Math.min(photos.photos.done + 1, photos.photos.total)} of ${photos.photos.total}`}
          value={current.sentBytes}
          max={current.totalBytes}
          valueText={`${percentText(current.sentBytes, current.totalBytes)} of ${formatBytes(current.totalBytes)}`}
        />
      ) : null}
      {update.state !== 'waiting' ? (
        <ProgressBar
          label="Fetching the server’s update"
          value={update.pages}
          max={update.state === 'running' ? null : Math.max(1, update.pages)}
          valueText={updateText(update)}
          tone={toneOf(update.state)}
        />
      ) : null}
      {progress.outcome === 'stopped' ? (
        <Text variant="small" color={colors.near}>
          The sync stopped here. What was sent is on the server; the rest is kept on this phone and goes with
          the next sync.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.sm },
});
