import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { CheckField } from '@/components/check-field';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';

/**
 * The inspector's declaration at submit: the inspection body's text in full, and a box they tick
 * themselves. The record keeps the text exactly as shown, with their name and the time of submitting.
 */
export function DeclarationConfirm({
  text,
  name,
  value,
  onChange,
  fromDefault,
}: {
  text: string;
  name: string;
  value: boolean;
  onChange: (v: boolean) => void;
  /** The phone has not pulled the inspection body's own text yet and shows the default. */
  fromDefault?: boolean;
}) {
  return (
    <Card>
      <Text variant="heading">Declaration</Text>
      <View style={styles.quote} accessibilityLabel="Declaration text">
        <Text>{text}</Text>
      </View>
      {fromDefault ? (
        <Text variant="small" muted>
          This is the standard text; sync to get your inspection body&apos;s own.
        </Text>
      ) : null}
      <CheckField label={`I, ${name}, make this declaration`} value={value} onChange={onChange} />
      {!value ? (
        <Text variant="small" muted>
          The inspection can be submitted once you have ticked the box.
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  quote: {
    borderLeftWidth: 3,
    borderLeftColor: colors.base,
    backgroundColor: colors.bg,
    borderRadius: radius.sm,
    padding: space.md,
  },
});
