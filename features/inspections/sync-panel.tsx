import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { formatShortStamp } from '@/lib/dates';
import { fieldKeys } from '@/features/device-db';
import { type SyncStatus, type SyncStatusHook, SyncProgressView } from '@/features/sync/ui';

function ago(iso: string | null): string {
  if (!iso) return 'never';
  const s = Math.round((Date.now() - new Date(iso).getTime()) / 1000);
  if (s < 60) return 'just now';
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  return formatShortStamp(iso);
}

const count = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;

/**
 * One line on where things stand. "Everything is sent" only when nothing waits and nothing was refused
 * (a refused record or photo is not on the server either), and only once the counts have been read.
 */
export function headline(
  s: Pick<SyncStatus, 'waiting' | 'photosWaiting' | 'needsAttention' | 'photosRefused'> &
    Partial<Pick<SyncStatus, 'loaded'>>,
) {
  // Until the phone's own counts are read (a reload drawn from the glimpse), it claims nothing.
  if (s.loaded === false) return 'Reading what waits on this phone…';
  const refused = s.needsAttention.length + s.photosRefused.length;
  if (s.waiting > 0) return `${count(s.waiting, 'inspection')} waiting to send`;
  if (refused > 0) return `${count(refused, 'item')} refused by the server`;
  if (s.photosWaiting > 0) return `${count(s.photosWaiting, 'photo')} waiting to send`;
  return 'Everything is sent';
}

/**
 * Said plainly while the phone has no network: that it is offline, what waits on it, and that it goes by
 * itself when the connection returns (nothing is sent meanwhile, so nothing fails either).
 */
export function offlineLine(s: Pick<SyncStatus, 'waiting' | 'photosWaiting'>): string {
  const parts = [
    s.waiting > 0 ? count(s.waiting, 'inspection') : null,
    s.photosWaiting > 0 ? count(s.photosWaiting, 'photo') : null,
  ].filter((p): p is string => p !== null);
  if (parts.length === 0)
    return 'This phone is offline. Nothing is waiting; what you record is kept here until the connection returns.';
  const one = s.waiting + s.photosWaiting === 1;
  return `This phone is offline. ${parts.join(' and ')} ${one ? 'waits' : 'wait'} here and will be sent when the connection returns.`;
}

/** What is waiting to go to the server, how the last sync went, and a way to sync now. */
export function SyncPanel({ status }: { status: SyncStatusHook }) {
  const client = useQueryClient();
  // A finished sync may have brought new rides, designs or templates: re-read the device lists. A sync
  // that sent records but then failed (photos, pull) records no success, yet the sent list must move them
  // out of "Waiting to send": so the outbox counts are followed too.
  useEffect(() => {
    void client.invalidateQueries({ queryKey: fieldKeys.all });
  }, [status.lastSuccessAt, status.waiting, status.accepted, status.needsAttention.length, client]);

  const photoLine = status.currentPhoto
    ? `sending a photo: ${Math.round((100 * status.currentPhoto.sentBytes) / Math.max(1, status.currentPhoto.totalBytes))} %`
    : `${status.photosWaiting} photo${status.photosWaiting === 1 ? '' : 's'} waiting`;
  return (
    <Card style={styles.panel} accessibilityLabel="Sync status">
      <View style={styles.row}>
        <View style={styles.grow}>
          {/* Until the phone's own counts are read (a reload drawn from the glimpse), claim nothing. */}
          <Text variant="heading">
            {status.loaded ? headline(status) : 'Reading what waits on this phone…'}
          </Text>
          {status.loaded ? (
            <Text variant="small" muted>
              {photoLine} · last sync {ago(status.lastSuccessAt)}
            </Text>
          ) : null}
        </View>
        <Button
          label={status.running ? 'Syncing…' : 'Sync now'}
          tone="quiet"
          busy={status.running}
          disabled={!status.online}
          onPress={() => void status.syncNow()}
        />
      </View>
      <SyncProgressView progress={status.progress} />
      {status.online ? null : (
        <View style={styles.offline} role="status" accessibilityLiveRegion="polite">
          <Feather name="cloud-off" size={16} color={colors.near} />
          <Text variant="small" color={colors.near} style={styles.grow}>
            {offlineLine(status)}
          </Text>
        </View>
      )}
      {status.lastError ? (
        <Text variant="small" color={colors.near} role="alert">
          Last attempt: {status.lastError} Nothing is lost; it will try again.
        </Text>
      ) : null}
      {status.needsAttention.map((item) => (
        <View key={item.id} style={styles.attention} role="alert">
          <Text variant="heading" color={colors.over}>
            The server refused an inspection
          </Text>
          {(item.issues ?? []).map((i) => (
            <Text key={`${i.path}${i.message}`} variant="small">
              {i.path}: {i.message}
            </Text>
          ))}
          <Button label="Send again" tone="quiet" onPress={() => void status.retryRecord(item.id)} />
        </View>
      ))}
      {status.photosRefused.map((p) => (
        <View key={p.sha256} style={styles.attention} role="alert">
          <Text variant="small" color={colors.over}>
            A photo was refused by the server{p.lastError ? `: ${p.lastError}` : ''}.
          </Text>
          <Button label="Send again" tone="quiet" onPress={() => void status.retryPhoto(p.sha256)} />
        </View>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md },
  grow: { flex: 1, gap: 2 },
  offline: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  attention: { gap: space.xs, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
});
