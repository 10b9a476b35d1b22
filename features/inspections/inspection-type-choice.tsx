import { Pressable, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { type InspectionType, inspectionTypeLabel, inspectionTypes } from '@/features/records/schema';

/**
 * The inspection types as one row of choices: pressing one starts that inspection. The assigned type, when
 * there is one, is drawn with the ride's colour around it.
 */
export function InspectionTypeChoice({
  onChoose,
  suggested,
  disabled = false,
}: {
  onChoose: (type: InspectionType) => void;
  suggested?: InspectionType | null;
  disabled?: boolean;
}) {
  return (
    <View style={styles.types} role="radiogroup" accessibilityLabel="Inspection type">
      {inspectionTypes.map((t) => (
        <Pressable
          key={t}
          role="radio"
          aria-checked={false}
          disabled={disabled}
          onPress={() => onChoose(t)}
          style={StyleSheet.flatten([styles.type, suggested === t && styles.suggested])}
        >
          <Text variant="label">{inspectionTypeLabel[t]}</Text>
        </Pressable>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  types: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  type: {
    minHeight: layout.touchTarget,
    justifyContent: 'center',
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  suggested: { borderColor: colors.base },
});
