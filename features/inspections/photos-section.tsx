import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, space } from '@/components/theme';
import type { Draft } from '@/features/records';
import type { PhotoRef } from '@/features/records/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { photoTakenLine } from '@/features/photos';
import { PhotoPlaceToggle } from '@/features/inspections/photo-place-toggle';

type Props = {
  draft: Draft;
  design: DesignData | null;
  /** Shows a stored photo (the screen reads its bytes from the device store). */
  Thumb: (props: { photo: PhotoRef }) => React.ReactNode;
  onCapture: (source: 'camera' | 'library') => void;
  onUpdate: (id: string, patch: Partial<Pick<PhotoRef, 'caption' | 'joint' | 'checklistItemId'>>) => void;
  onRemove: (id: string) => void;
  busy?: boolean;
  error?: string | null;
  /** Items whose template asks for a photo. */
  photoItems?: Set<string>;
};

/** Photos of pivot wear and failed items: taken, captioned and tied to a pivot or a checklist item. */
export function PhotosSection({
  draft,
  design,
  Thumb,
  onCapture,
  onUpdate,
  onRemove,
  busy,
  error,
  photoItems,
}: Props) {
  const pivots = design?.bodies.map((b, i) => design.pivots.find((p) => p.joint === i)?.name ?? b.name) ?? [];
  // Offer the items a photo can serve: failed ones and those whose template asks for a photo.
  const wantsPhoto = new Set(draft.checklist.filter((a) => a.result === 'fail').map((a) => a.itemId));
  draft.photos.forEach((p) => p.checklistItemId && wantsPhoto.add(p.checklistItemId));
  const failed = draft.checklist.filter((a) => wantsPhoto.has(a.itemId) || photoItems?.has(a.itemId));
  return (
    <View style={styles.root}>
      <View style={styles.actions}>
        <Button label="Take a photo" onPress={() => onCapture('camera')} busy={busy} />
        <Button
          label="Choose from library"
          tone="quiet"
          onPress={() => onCapture('library')}
          disabled={busy}
        />
      </View>
      {error ? (
        <Text role="alert" color={colors.danger}>
          {error}
        </Text>
      ) : null}
      <Text variant="small" muted>
        Keep riders and bystanders out of frame. Photos are reduced to 1600 px on the long edge on this phone,
        and their EXIF is removed once the time (and, if you allow it, the place) is read.
      </Text>
      <PhotoPlaceToggle />
      {draft.photos.map((photo, n) => (
        <Card key={photo.id}>
          <View style={styles.photoRow}>
            <Thumb photo={photo} />
            <View style={styles.photoMeta}>
              <Text variant="label" muted>
                PHOTO {n + 1} · {Math.round(photo.bytes / 1024)} KB
              </Text>
              <Text variant="small" muted>
                {photoTakenLine(photo)}
              </Text>
              <TextField
                label="Caption"
                value={photo.caption}
                onChangeText={(caption) => onUpdate(photo.id, { caption })}
              />
            </View>
          </View>
          <Text variant="label" muted>
            SHOWS
          </Text>
          <View style={styles.chips}>
            {pivots.map((name, i) => (
              <Chip
                key={`p${i}`}
                label={`Pivot ${i + 1} · ${name}`}
                selected={photo.joint === i}
                onPress={() => onUpdate(photo.id, { joint: photo.joint === i ? null : i })}
              />
            ))}
            {failed.map((a) => (
              <Chip
                key={a.itemId}
                label={a.text}
                selected={photo.checklistItemId === a.itemId}
                onPress={() =>
                  onUpdate(photo.id, {
                    checklistItemId: photo.checklistItemId === a.itemId ? null : a.itemId,
                  })
                }
              />
            ))}
            {photo.checklistItemId && !failed.some((a) => a.itemId === photo.checklistItemId) ? (
              <Chip
                label={
                  draft.checklist.find((a) => a.itemId === photo.checklistItemId)?.text ??
                  photo.checklistItemId
                }
                selected
                onPress={() => onUpdate(photo.id, { checklistItemId: null })}
              />
            ) : null}
          </View>
          <Button
            label="Remove photo"
            tone="danger"
            onPress={() => onRemove(photo.id)}
            accessibilityLabel={`Remove photo ${n + 1}`}
          />
        </Card>
      ))}
    </View>
  );
}

function Chip({ label, selected, onPress }: { label: string; selected: boolean; onPress: () => void }) {
  return (
    <Pressable
      role="checkbox"
      aria-checked={selected}
      onPress={onPress}
      style={StyleSheet.flatten([styles.chip, selected && styles.chipSelected])}
    >
      <Text variant="small" color={selected ? colors.baseText : colors.text} numberOfLines={1}>
        {label}
      </Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.md },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  photoRow: { flexDirection: 'row', gap: space.md },
  photoMeta: { flex: 1, gap: space.sm },
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: layout.touchTarget,
    maxWidth: 320,
    justifyContent: 'center',
    paddingHorizontal: space.md,
    borderRadius: layout.touchTarget / 2,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  chipSelected: { backgroundColor: colors.base, borderColor: colors.base },
});
