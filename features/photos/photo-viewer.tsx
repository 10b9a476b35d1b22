import { Image, Modal, StyleSheet, View, useWindowDimensions } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, space } from '@/components/theme';
import { usePhotoSource } from '@/features/photos/photo-source';

/** What the full-size view needs of a photo; `received: false` says the phone has not uploaded it yet. */
type ViewedPhoto = { sha256: string; caption: string; received?: boolean };

/**
 * One photo at full size over the page, with its caption and, when given, a line of details under it.
 * Closes with the button, the Escape key (the web Modal's request to close) or the back gesture; steps
 * through the others. The backdrop is opaque, and on the web the Modal keeps Tab's focus inside it.
 * `index` is the open photo's place in `photos`, or null when none is open.
 */
export function FullSizePhotoViewer<P extends ViewedPhoto>({
  photos,
  index,
  onChange,
  details,
}: {
  photos: readonly P[];
  index: number | null;
  onChange: (index: number | null) => void;
  details?: (photo: P) => string;
}) {
  const photo = index === null ? null : (photos[index] ?? null);
  const close = () => onChange(null);
  return (
    <Modal visible={photo !== null} transparent animationType="fade" onRequestClose={close}>
      {photo !== null && index !== null ? (
        <View style={styles.backdrop} role="dialog" aria-modal accessibilityLabel="Photo, full size">
          <View style={styles.bar}>
            <Text variant="label" color={colors.chromeMuted}>
              PHOTO {index + 1} OF {photos.length}
            </Text>
            <Button label="Close" tone="quiet" onPress={close} icon={<Feather name="x" size={18} />} />
          </View>
          {/* Leave room for the bar, the caption (and its details) and the buttons. */}
          <FullPhoto photo={photo} reserve={details ? 240 : 220} />
          <View style={styles.caption}>
            <Text variant="heading" color={colors.chromeText}>
              {photo.caption || 'No caption'}
            </Text>
            {details ? (
              <Text variant="small" color={colors.chromeMuted}>
                {details(photo)}
              </Text>
            ) : null}
          </View>
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

function FullPhoto({ photo, reserve }: { photo: ViewedPhoto; reserve: number }) {
  const { width, height } = useWindowDimensions();
  const received = photo.received ?? true;
  const { source, failed } = usePhotoSource(photo.sha256, received);
  const box = { width: Math.min(width - 2 * space.lg, 1400), height: Math.max(200, height - reserve) };
  return (
    <View style={StyleSheet.flatten([styles.full, box])}>
      {!received ? (
        <Text color={colors.chromeText}>The phone has not uploaded this photo yet.</Text>
      ) : failed ? (
        <Text color={colors.chromeText}>
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
        <Spinner color={colors.chromeText} size="large" />
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  backdrop: {
    flex: 1,
    // Opaque: the page behind must not read through the photo, its caption or the buttons.
    backgroundColor: colors.chrome,
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
  caption: { width: '100%', maxWidth: 1400, gap: 2 },
  nav: { flexDirection: 'row', gap: space.sm },
});
