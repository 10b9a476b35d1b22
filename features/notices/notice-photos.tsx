import { useState } from 'react';
import { Image, Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { usePhotoSource } from '@/features/photos';
import { FullSizePhotoViewer } from '@/features/photos/ui';

type NoticePhoto = { sha256: string; caption: string };

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
      <FullSizePhotoViewer photos={photos} index={open} onChange={setOpen} />
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
          <Spinner color={colors.base} />
        </View>
      )}
    </Pressable>
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
});
