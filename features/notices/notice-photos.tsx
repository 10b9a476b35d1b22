import Feather from '@expo/vector-icons/Feather';
import { useState } from 'react';
import {
  ActivityIndicator,
  Image,
  Modal,
  Pressable,
  StyleSheet,
  View,
  useWindowDimensions,
} from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { usePhotoSource } from '@/features/review/photo-source';

export type NoticePhoto = { sha256: string; caption: string };

const THUMB = 96;

/**
 * Photos on a notice (a finding's, or the evidence with a corrective action) as thumbnails; one opens at
 * full size over the page and steps through the others.
 */
export function NoticePhotos({ photos, label }: { photos: readonly NoticePhoto[]; label: string }) {
  const [open, setOpen] = useState<number | null>(null);
  if (photos.length === 0) return null;
  return (
    <>
      <View style={styles.grid} role="group" accessibilityLabel={label}>
        {photos.map((p, i) => (
          <Thumb key={`${p.sha256}-${i}`} photo={p} onOpen={() => setOpen(i)} />
        ))}
      </View>
      <Viewer photos={photos} index={open} onChange={setOpen} />
    </>
  );
}

function Thumb({ photo, onOpen }: { photo: NoticePhoto; onOpen: () => void }) {
  const { source, failed } = usePhotoSource(photo.sha256);
  return (
    <Pressable
      role="button"
      accessibilityLabel={`Open photo: ${photo.caption || 'no caption'}`}
      onPress={onOpen}
      style={styles.thumb}
    >
      {failed ? (
        <View style={styles.placeholder}>
          <Feather name="image" size={18} color={colors.textMuted} />
          <Text variant="small" muted style={styles.center}>
            Not loaded
          </Text>
        </View>
      ) : source ? (
        <Image source={source} style={styles.image} resizeMode="cover" accessibilityIgnoresInvertColors />
      ) : (
        <View style={styles.placeholder}>
          <ActivityIndicator color={colors.base} />
        </View>
      )}
    </Pressable>
  );
}

function Viewer({
  photos,
  index,
  onChange,
}: {
  photos: readonly NoticePhoto[];
  index: number | null;
  onChange: (index: number | null) => void;
}) {
  const photo = index === null ? null : (photos[index] ?? null);
  const close = () => onChange(null);
  return (
    <Modal visible={photo !== null} transparent animationType="fade" onRequestClose={close}>
      {photo !== null && index !== null ? (
        <View style={styles.backdrop} role="dialog" aria-modal accessibilityLabel="Photo, full size">
          <View style={styles.bar}>
            <Text variant="label" color={colors.baseMuted}>
              PHOTO {index + 1} OF {photos.length}
            </Text>
            <Button label="Close" tone="quiet" onPress={close} icon={<Feather name="x" size={18} />} />
          </View>
          <FullPhoto photo={photo} />
          <Text variant="heading" color={colors.baseText} style={styles.caption}>
            {photo.caption || 'No caption'}
          </Text>
          {photos.length > 1 ? (
            <View style={styles.nav}>
              <Button
                label="Previous"
                tone="quiet"
                disabled={index === 0}
                onPress={() => onChange(index - 1)}
              />
              <Button
                label="Next"
                tone="quiet"
                disabled={index === photos.length - 1}
                onPress={() => onChange(index + 1)}
              />
            </View>
          ) : null}
        </View>
      ) : null}
    </Modal>
  );
}

function FullPhoto({ photo }: { photo: NoticePhoto }) {
  const { width, height } = useWindowDimensions();
  const { source, failed } = usePhotoSource(photo.sha256);
  const box = { width: Math.min(width - 2 * space.lg, 1400), height: Math.max(200, height - 220) };
  return (
    <View style={StyleSheet.flatten([styles.full, box])}>
      {failed ? (
        <Text color={colors.baseText}>
          This photo could not be loaded. Check the connection and try again.
        </Text>
      ) : source ? (
        <Image
          source={source}
          style={box}
          resizeMode="contain"
          accessibilityLabel={photo.caption || 'Photo without caption'}
          accessibilityIgnoresInvertColors
        />
      ) : (
        <ActivityIndicator color={colors.baseText} size="large" />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  thumb: {
    width: THUMB,
    height: THUMB,
    borderRadius: radius.md,
    overflow: 'hidden',
    backgroundColor: colors.surfaceSunk,
    borderWidth: 1,
    borderColor: colors.border,
  },
  image: { width: '100%', height: '100%' },
  placeholder: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space.xs, padding: space.xs },
  center: { textAlign: 'center' },
  backdrop: {
    flex: 1,
    backgroundColor: 'rgba(10, 24, 32, 0.94)',
    alignItems: 'center',
    justifyContent: 'center',
    padding: space.lg,
    gap: space.md,
  },
  bar: {
    width: '100%',
    maxWidth: 1400,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    minHeight: layout.touchTarget,
  },
  full: { alignItems: 'center', justifyContent: 'center' },
  caption: { width: '100%', maxWidth: 1400 },
  nav: { flexDirection: 'row', gap: space.sm },
});
