import Feather from '@expo/vector-icons/Feather';
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
import { formatDateTime } from '@/features/registry/text';
import type { InspectionPhoto } from '@/features/review/inspection-schema';
import { usePhotoSource } from '@/features/review/photo-source';

const THUMB = 132;

/** The photo's place in the inspection: its pivot or checklist item, for captions and spoken labels. */
export type PhotoContext = (photo: InspectionPhoto) => string | null;

/** A square preview that opens the full-size view. Bytes not yet uploaded say so instead of spinning. */
export function PhotoThumb({
  photo,
  onOpen,
  size = THUMB,
  context,
}: {
  photo: InspectionPhoto;
  onOpen: (photoId: string) => void;
  size?: number;
  context?: string | null;
}) {
  const { source, failed } = usePhotoSource(photo.sha256, photo.received);
  const name = photo.caption || 'Photo without caption';
  return (
    <Pressable
      role="button"
      accessibilityLabel={`Open photo: ${name}${context ? ` (${context})` : ''}`}
      onPress={() => onOpen(photo.id)}
      style={StyleSheet.flatten([styles.thumb, { width: size, height: size }])}
    >
      {!photo.received ? (
        <View style={styles.placeholder}>
          <Feather name="upload-cloud" size={20} color={colors.textMuted} />
          <Text variant="small" muted style={styles.center}>
            Not uploaded from the phone yet
          </Text>
        </View>
      ) : failed ? (
        <View style={styles.placeholder}>
          <Feather name="image" size={20} color={colors.textMuted} />
          <Text variant="small" muted style={styles.center}>
            Could not be loaded
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

/** Every photo of the inspection as thumbnails with their captions. */
export function PhotoGallery({
  photos,
  onOpen,
  context,
}: {
  photos: InspectionPhoto[];
  onOpen: (photoId: string) => void;
  context: PhotoContext;
}) {
  if (photos.length === 0) return <Text muted>No photos were taken in this inspection.</Text>;
  return (
    <View style={styles.grid} accessibilityLabel={`${photos.length} photos`}>
      {photos.map((p) => {
        const where = context(p);
        return (
          <View key={p.id} style={styles.tile}>
            <PhotoThumb photo={p} onOpen={onOpen} context={where} />
            <Text variant="small" numberOfLines={2}>
              {p.caption || 'No caption'}
            </Text>
            {where ? (
              <Text variant="small" muted numberOfLines={1}>
                {where}
              </Text>
            ) : null}
          </View>
        );
      })}
    </View>
  );
}

/**
 * One photo at full size over the page, with its caption and where it belongs. Closes with the button,
 * the Escape key (the web Modal's request to close) or the back gesture; steps through the others.
 */
export function PhotoViewer({
  photos,
  openId,
  onChange,
  context,
}: {
  photos: InspectionPhoto[];
  openId: string | null;
  onChange: (photoId: string | null) => void;
  context: PhotoContext;
}) {
  const index = photos.findIndex((p) => p.id === openId);
  const photo = index >= 0 ? photos[index] : null;
  const close = () => onChange(null);
  return (
    <Modal visible={photo !== null} transparent animationType="fade" onRequestClose={close}>
      {photo ? (
        <View style={styles.backdrop} role="dialog" aria-modal accessibilityLabel="Photo, full size">
          <View style={styles.viewerBar}>
            <Text variant="label" color={colors.baseMuted}>
              PHOTO {index + 1} OF {photos.length}
            </Text>
            <Button label="Close" tone="quiet" onPress={close} icon={<Feather name="x" size={18} />} />
          </View>
          <FullPhoto photo={photo} />
          <View style={styles.viewerCaption}>
            <Text variant="heading" color={colors.baseText}>
              {photo.caption || 'No caption'}
            </Text>
            <Text variant="small" color={colors.baseMuted}>
              {[
                context(photo),
                `Taken ${formatDateTime(photo.takenAt)}`,
                `${Math.round(photo.bytes / 1024)} KB`,
              ]
                .filter(Boolean)
                .join(' · ')}
            </Text>
          </View>
          {photos.length > 1 ? (
            <View style={styles.viewerNav}>
              <Button
                label="Previous"
                tone="quiet"
                disabled={index === 0}
                onPress={() => onChange(photos[index - 1].id)}
              />
              <Button
                label="Next"
                tone="quiet"
                disabled={index === photos.length - 1}
                onPress={() => onChange(photos[index + 1].id)}
              />
            </View>
          ) : null}
        </View>
      ) : null}
    </Modal>
  );
}

function FullPhoto({ photo }: { photo: InspectionPhoto }) {
  const { width, height } = useWindowDimensions();
  const { source, failed } = usePhotoSource(photo.sha256, photo.received);
  // Leave room for the bar, the caption and the buttons.
  const box = { width: Math.min(width - 2 * space.lg, 1400), height: Math.max(200, height - 240) };
  return (
    <View style={StyleSheet.flatten([styles.full, box])}>
      {!photo.received ? (
        <Text color={colors.baseText}>The phone has not uploaded this photo yet.</Text>
      ) : failed ? (
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
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  tile: { width: THUMB, gap: 2 },
  thumb: {
    borderRadius: radius.md,
    overflow: 'hidden',
    backgroundColor: colors.surfaceSunk,
    borderWidth: 1,
    borderColor: colors.border,
  },
  image: { width: '100%', height: '100%' },
  placeholder: { flex: 1, alignItems: 'center', justifyContent: 'center', gap: space.xs, padding: space.sm },
  center: { textAlign: 'center' },
  backdrop: {
    flex: 1,
    backgroundColor: 'rgba(10, 24, 32, 0.94)',
    alignItems: 'center',
    justifyContent: 'center',
    padding: space.lg,
    gap: space.md,
  },
  viewerBar: {
    width: '100%',
    maxWidth: 1400,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    minHeight: layout.touchTarget,
  },
  full: { alignItems: 'center', justifyContent: 'center' },
  viewerCaption: { width: '100%', maxWidth: 1400, gap: 2 },
  viewerNav: { flexDirection: 'row', gap: space.sm },
});
