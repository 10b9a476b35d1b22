import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import {
  DownloadProgressBar,
  type PaperSize,
  downloadPdf,
  handOverVerb,
  pdfFileName,
  useDownloadProgress,
} from '@/features/api/ui';

/**
 * The admin's sheet of plates as a PDF (GET /api/plates.pdf): a QR label for each ride and each of its
 * pivots, to print on A4 or US Letter and fix on the ride. One ride's (`ride`) or the whole register's.
 */
export function PlateSheetDownload({ ride }: { ride?: { id: string; name: string } }) {
  const [busy, setBusy] = useState<PaperSize | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const progress = useDownloadProgress();
  const what = ride ? `the plates of ${ride.name} and its pivots` : 'the plates of every ride and pivot';
  const download = async (size: PaperSize) => {
    setBusy(size);
    setMessage(null);
    try {
      const query = `size=${size}${ride ? `&rideId=${encodeURIComponent(ride.id)}` : ''}`;
      const name = pdfFileName(ride ? `plates-${ride.name}` : 'plates', size);
      setMessage({ ok: true, text: await downloadPdf(`/api/plates.pdf?${query}`, name, progress.track) });
    } catch (err) {
      const why =
        err instanceof OfflineError
          ? 'No connection: the server makes the sheet, so try again when you are online.'
          : err instanceof ApiRequestError || err instanceof Error
            ? err.message
            : 'Try again.';
      setMessage({ ok: false, text: `The sheet could not be fetched. ${why}` });
    } finally {
      setBusy(null);
      progress.clear();
    }
  };
  return (
    <Card accessibilityLabel="QR plates">
      <Text variant="heading">QR plates</Text>
      <Text variant="small" muted>
        {ride
          ? `A label with a QR code for ${ride.name} and one for each of its pivots, named in words too.`
          : 'A label with a QR code for each ride and each pivot in the register, named in words too.'}{' '}
        An inspector’s Scan on Today, or any phone camera, opens Pivotwatch there.
      </Text>
      <View style={styles.row}>
        <Button
          label="Plates · A4"
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          busy={busy === 'A4'}
          disabled={busy !== null}
          accessibilityLabel={`Plates · A4: ${handOverVerb} ${what} as a PDF`}
          onPress={() => void download('A4')}
        />
        <Button
          label="Letter"
          tone="quiet"
          busy={busy === 'LETTER'}
          disabled={busy !== null}
          accessibilityLabel={`Letter: ${handOverVerb} ${what} as a PDF on US Letter paper`}
          onPress={() => void download('LETTER')}
        />
      </View>
      <DownloadProgressBar progress={progress.progress} label="Sheet of plates" />
      {message ? (
        <Text
          variant="small"
          role={message.ok ? 'status' : 'alert'}
          color={message.ok ? undefined : colors.danger}
        >
          {message.text}
        </Text>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
