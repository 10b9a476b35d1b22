import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import {
  DownloadProgressBar,
  type OnDownloadProgress,
  type PaperSize,
  downloadPdf,
  handOverVerb,
  pdfFileName,
  useDownloadProgress,
} from '@/features/api/ui';

/** The inspection report's PDF: the inspector's own copy of what they recorded. */
const downloadInspectionReport = (
  inspection: { id: string; rideName: string; submittedAt: string | null },
  size: PaperSize,
  onProgress: OnDownloadProgress,
) =>
  downloadPdf(
    `/api/inspections/${encodeURIComponent(inspection.id)}/report.pdf?size=${size}`,
    pdfFileName(`inspection-${inspection.rideName}-${(inspection.submittedAt ?? '').slice(0, 10)}`, size),
    onProgress,
  );

/**
 * The inspector's own copy of a sent inspection as a PDF: the share sheet on a phone, a download on the
 * web. The server makes it from the record it accepted, so it needs a connection; the record itself
 * stays on the phone either way.
 */
export function ReportDownload({
  inspection,
}: {
  inspection: { id: string; rideName: string; submittedAt: string | null };
}) {
  const [busy, setBusy] = useState<PaperSize | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const progress = useDownloadProgress();
  const download = async (size: PaperSize) => {
    setBusy(size);
    setMessage(null);
    try {
      setMessage({ ok: true, text: await downloadInspectionReport(inspection, size, progress.track) });
    } catch (err) {
      const why =
        err instanceof OfflineError
          ? 'No connection: the report is made by the server, so download it when you have signal.'
          : err instanceof ApiRequestError || err instanceof Error
            ? err.message
            : 'Try again.';
      setMessage({ ok: false, text: `The report could not be fetched. ${why}` });
    } finally {
      setBusy(null);
      progress.clear();
    }
  };
  const icon = <Feather name="download" size={18} color={colors.text} />;
  return (
    <View style={styles.box}>
      <View style={styles.row}>
        <Button
          label="My report · A4"
          tone="quiet"
          icon={icon}
          busy={busy === 'A4'}
          disabled={busy !== null}
          // The name begins with the words drawn (WCAG 2.5.3), then says what the button does.
          accessibilityLabel={`My report · A4: ${handOverVerb} the inspection report of ${inspection.rideName} as a PDF`}
          onPress={() => download('A4')}
        />
        <Button
          label="Letter"
          tone="quiet"
          busy={busy === 'LETTER'}
          disabled={busy !== null}
          accessibilityLabel={`Letter: ${handOverVerb} the inspection report of ${inspection.rideName} as a PDF on US Letter paper`}
          onPress={() => download('LETTER')}
        />
      </View>
      <DownloadProgressBar
        progress={progress.progress}
        label={`Inspection report of ${inspection.rideName}`}
      />
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
