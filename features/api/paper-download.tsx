import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { DownloadProgressBar, useDownloadProgress } from '@/features/api/download-progress-bar';
import type { OnDownloadProgress } from '@/features/api/download-progress';
import type { PaperSize } from '@/features/api/pdf-download';
import { handOverVerb } from '@/features/api/save-or-share';

/**
 * A PDF the server makes, offered on A4 and US Letter: two buttons, the download's progress, then what
 * became of it (where it went, or why it could not be fetched). `fetch` downloads one size and answers
 * the words to show (downloadPdf's).
 */
export function PaperSizeDownload({
  label,
  what,
  progressLabel,
  failure,
  offline,
  fetch,
}: {
  /** The A4 button's words, e.g. "My report": it reads "My report · A4"; the other reads "Letter". */
  label: string;
  /** What the PDF holds, for the buttons' accessible names: "the plates of every ride and pivot". */
  what: string;
  progressLabel: string;
  /** The start of the failure message: "The report could not be fetched." */
  failure: string;
  /** Why, when there is no connection. */
  offline: string;
  fetch: (size: PaperSize, onProgress: OnDownloadProgress) => Promise<string>;
}) {
  const [busy, setBusy] = useState<PaperSize | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const progress = useDownloadProgress();
  const download = async (size: PaperSize) => {
    setBusy(size);
    setMessage(null);
    try {
      setMessage({ ok: true, text: await fetch(size, progress.track) });
    } catch (err) {
      const why =
        err instanceof OfflineError
          ? offline
          : err instanceof ApiRequestError || err instanceof Error
            ? err.message
            : 'Try again.';
      setMessage({ ok: false, text: `${failure} ${why}` });
    } finally {
      setBusy(null);
      progress.clear();
    }
  };
  return (
    <View style={styles.box}>
      <View style={styles.row}>
        <Button
          label={`${label} · A4`}
          tone="quiet"
          icon={<Feather name="download" size={18} color={colors.text} />}
          busy={busy === 'A4'}
          disabled={busy !== null}
          // The name begins with the words drawn (WCAG 2.5.3), then says what the button does.
          accessibilityLabel={`${label} · A4: ${handOverVerb} ${what} as a PDF`}
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
      <DownloadProgressBar progress={progress.progress} label={progressLabel} />
      {message ? (
        <Text
          variant="small"
          role={message.ok ? 'status' : 'alert'}
          color={message.ok ? undefined : colors.danger}
        >
          {message.text}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.xs },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
