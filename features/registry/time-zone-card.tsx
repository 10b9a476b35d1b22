import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { SettingFooter } from '@/components/setting-footer';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { space } from '@/components/theme';
import { useTimeZoneSettingMutation, useTimeZoneSettingQuery } from '@/features/registry/api';
import { formatWhen, timeZoneProblem } from '@/lib/dates';

/**
 * The inspection body's default time zone (admins): the clock of every site that names none of its own.
 * The name is checked here as the server checks it (a zone this platform's Intl knows).
 */
export function TimeZoneCard() {
  const setting = useTimeZoneSettingQuery();
  const save = useTimeZoneSettingMutation();
  // What the admin has typed; until then, the saved zone.
  const [draft, setDraft] = useState<string | null>(null);
  const current = setting.data;
  const zone = draft ?? current?.zone ?? '';
  const problem = zone.trim() === '' ? 'Choose a time zone' : timeZoneProblem(zone.trim());
  const changed = !!current && zone.trim() !== current.zone;
  return (
    <Card accessibilityLabel="Default time zone for sites">
      <Text variant="heading">Default time zone for sites</Text>
      <Text variant="small" muted>
        A site with no time zone of its own counts its “today”, due dates and 07:00 reminders on this clock.
      </Text>
      <View style={styles.row}>
        <View style={styles.field}>
          <TextField
            label="IANA time zone"
            value={zone}
            onChangeText={setDraft}
            autoCapitalize="none"
            error={changed && problem ? problem : undefined}
            placeholder="e.g. Europe/London"
          />
        </View>
        <Button
          label="Save"
          disabled={!changed || !!problem}
          busy={save.isPending}
          onPress={() => save.mutate(zone.trim(), { onSuccess: () => setDraft(null) })}
        />
      </View>
      <SettingFooter
        changedAt={current?.updatedAt ? formatWhen(current.updatedAt, current.zone) : null}
        changedBy={current?.updatedByName}
        error={save.error ?? setting.error}
      />
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md, alignItems: 'flex-end' },
  field: { flexGrow: 1, flexBasis: 240, minWidth: 0 },
});
