import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { formatShortStamp } from '@/lib/dates';
import { fieldKeys } from '@/features/device-db';
import type { SyncStatus, SyncStatusHook } from '@/features/sync/ui';

function ago(iso: string | null): string {
  if (!iso) return 'never';
  const s = Math.round((Date.now() - new Date(iso).getTime()) / 1000);
  if (s < 60) return 'just now';
  if (s < 3600) return `${Math.round(s / 60)} min ago`;
  return formatShortStamp(iso);
}

const count = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;

/**
 * One line on where things stand. "Everything is sent" only when nothing waits and nothing was refused:
 * a refused record or photo is not on the server either.
 */
export function headline(
  s: Pick<SyncStatus, 'waiting' | 'photosWaiting' | 'needsAttention' | 'photosRefused'>,
) {
  const refused = s.needsAttention.length + s.photosRefused.length;
  if (s.waiting > 0) return `${count(s.waiting, 'inspection')} waiting to send`;
  if (refused > 0) return `${count(refused, 'item')} refused by the server`;
  if (s.photosWaiting > 0) return `${count(s.photosWaiting, 'photo')} waiting to send`;
  return 'Everything is sent';
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
          <Text variant="heading">{headline(status)}</Text>
          <Text variant="small" muted>
            {photoLine} · last sync {ago(status.lastSuccessAt)}
            {status.online ? '' : ' · no connection'}
          </Text>
        </View>
        <Button
          label={status.running ? 'Syncing…' : 'Sync now'}
          tone="quiet"
          busy={status.running}
          disabled={!status.online}
          onPress={() => void status.syncNow()}
        />
      </View>
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
  attention: { gap: space.xs, paddingTop: space.sm, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
});
