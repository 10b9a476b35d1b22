import { StyleSheet } from 'react-native';

import { FormAlert } from '@/components/form-alert';
import { Text } from '@/components/text';
import { space } from '@/components/theme';

/**
 * The foot of an inspection-body setting's card: who changed it last and when (`changedAt`, already
 * formatted), and why the setting could not be read or saved.
 */
export function SettingFooter({
  changedAt,
  changedBy,
  error,
}: {
  changedAt: string | null;
  changedBy: string | null | undefined;
  error: Error | null | undefined;
}) {
  return (
    <>
      {changedAt ? (
        <Text variant="small" muted style={styles.changed}>
          {`Changed ${changedAt}${changedBy ? ` by ${changedBy}` : ''}`}
        </Text>
      ) : null}
      <FormAlert
        problem={error ? { message: error.message || 'The setting could not be read or saved.' } : null}
      />
    </>
  );
}

const styles = StyleSheet.create({ changed: { marginTop: space.xs } });
