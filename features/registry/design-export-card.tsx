import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { fileTypes, handOverVerb, saveOrShareText } from '@/features/api/ui';
import type { DesignData } from '@/features/loads/design-schema';
import { exportFileName } from '@/features/registry/import-report';
import { loadCsvModule } from '@/features/registry/csv-loader';
import type { RideSummary } from '@/features/rides/schema';

/** The design data as a file, the same format import reads (written by the same code as the server’s export). */
export function ExportCard({
  ride,
  version,
  data,
}: {
  ride: RideSummary;
  version: number;
  data: DesignData;
}) {
  const [saved, setSaved] = useState<string | null>(null);
  const save = async (format: 'csv' | 'json') => {
    const name = exportFileName(ride.name, version, format);
    // The app's only use of the design file code (the server reads imports): on the web it is a chunk of
    // its own, fetched on the first press rather than with every ride page.
    const csv = await loadCsvModule().catch(() => null);
    if (!csv) return setSaved('The file could not be made here without a connection. Try again online.');
    const { designToFile } = csv;
    setSaved(await saveOrShareText(name, designToFile(format, data), fileTypes[format]));
  };
  return (
    <Card>
      <Text variant="heading">Export v{version}</Text>
      <Text variant="small" muted>
        CSV (one row per part, pivot, seat…) or JSON, in SI units. Import reads the same files back.
      </Text>
      <View style={styles.buttons}>
        <Button
          label={`${handOverVerb} CSV`}
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          onPress={() => save('csv')}
        />
        <Button
          label={`${handOverVerb} JSON`}
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          onPress={() => save('json')}
        />
      </View>
      {saved ? (
        <Text variant="small" muted accessibilityLiveRegion="polite">
          {saved}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
