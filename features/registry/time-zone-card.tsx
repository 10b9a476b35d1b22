import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { SettingFooter } from '@/components/setting-footer';
import { Text } from '@/components/text';
import { SelectField } from '@/components/select-field';
import { space } from '@/components/theme';
import { useTimeZoneSettingMutation, useTimeZoneSettingQuery } from '@/features/registry/api';
import { timeZoneOptions } from '@/features/registry/time-zone-options';
import { formatWhen, timeZoneProblem } from '@/lib/dates';

/**
 * The inspection body's default time zone (admins): the clock of every site that names none of its own.
 * Chosen from the zones this platform's Intl knows (the saved one kept even when it is not listed), and
 * checked here as the server checks it.
 */
export function TimeZoneCard() {
  const setting = useTimeZoneSettingQuery();
  const save = useTimeZoneSettingMutation();
  // What the admin has chosen; until then, the saved zone.
  const [draft, setDraft] = useState<string | null>(null);
  const current = setting.data;
  const zone = draft ?? current?.zone ?? '';
  const options = useMemo(() => timeZoneOptions(current?.zone), [current?.zone]);
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
          <SelectField
            label="IANA time zone"
            value={zone || null}
            options={options}
            onChange={setDraft}
            error={changed && problem ? problem : undefined}
            placeholder="Choose a time zone"
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
