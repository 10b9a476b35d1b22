import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { downloadPdf } from '@/features/api/ui';
import { documentPath } from '@/features/documents/ui';

/** The maker's PDF of a bulletin: the share sheet on a phone, a download on the web. */
export function BulletinPdfButton({ sha256, reference }: { sha256: string; reference: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const open = async () => {
    try {
      setMessage(await downloadPdf(documentPath(sha256), `bulletin-${reference}.pdf`));
    } catch (err) {
      setMessage(err instanceof Error ? err.message : 'The bulletin could not be fetched.');
    }
  };
  return (
    <View style={styles.root}>
      <Button tone="quiet" label={`Bulletin ${reference} (PDF)`} onPress={open} style={styles.start} />
      {message ? (
        <Text variant="small" role="status" muted>
          {message}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.xs },
  start: { alignSelf: 'flex-start' },
});
