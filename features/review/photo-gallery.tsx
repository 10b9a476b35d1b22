import { Image, Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { InspectionPhoto } from '@/features/review/inspection-schema';
import { photoTakenLine, usePhotoSource } from '@/features/photos';
import { FullSizePhotoViewer } from '@/features/photos/ui';

const THUMB = 132;

/** The photo's place in the inspection: its pivot or checklist item, for captions and spoken labels. */
type PhotoContext = (photo: InspectionPhoto) => string | null;

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
          <Spinner color={colors.base} />
        </View>
      )}
    </Pressable>
  );
}

/**
 * Every photo of the inspection as thumbnails with their captions, and beside each when (and, where the
 * inspector allowed it, where) it was taken, on the site's clock (`zone`).
 */
export function PhotoGallery({
  photos,
  onOpen,
  context,
  zone,
}: {
  photos: InspectionPhoto[];
  onOpen: (photoId: string) => void;
  context: PhotoContext;
  zone?: string | null;
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
            <Text variant="small" muted>
              {photoTakenLine(p, zone)}
            </Text>
          </View>
        );
      })}
    </View>
  );
}

/**
 * One photo at full size over the page, with its caption and where it belongs (see
 * `FullSizePhotoViewer`); the open photo is named by its id.
 */
export function PhotoViewer({
  photos,
  openId,
  onChange,
  context,
  zone,
}: {
  photos: InspectionPhoto[];
  openId: string | null;
  onChange: (photoId: string | null) => void;
  context: PhotoContext;
  zone?: string | null;
}) {
  const index = photos.findIndex((p) => p.id === openId);
  return (
    <FullSizePhotoViewer
      photos={photos}
      index={index >= 0 ? index : null}
      onChange={(i) => onChange(i === null ? null : (photos[i]?.id ?? null))}
      details={(photo) =>
        [context(photo), photoTakenLine(photo, zone), `${Math.round(photo.bytes / 1024)} KB`]
          .filter(Boolean)
          .join(' · ')
      }
    />
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
});
