import * as DocumentPicker from 'expo-document-picker';
import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, fonts, space } from '@/components/theme';
import type { MotionRow, Smoothing } from '@/features/calculator/calculator-model';
import {
  type RecordColumn,
  describeRecord,
  parseRecord,
  recordColumnLabel,
} from '@/features/calculator/csv-record';
import { formatValue } from '@/features/loads';
import { readPickedFile } from '@/features/registry/ui';
import type { UnitSystem } from '@/lib/units';

/** A record larger than this is not a ride cycle's motion (100 000 rows of two numbers are ~2 MB). */
const MAX_FILE_BYTES = 4 * 1024 * 1024;

/**
 * A measured record for one joint: pasted or read from a .csv/.txt file, what its second column holds,
 * and how it is smoothed. The record is read as it is typed, so its problems show here, by line, before
 * the check is run.
 */
export function MeasuredRecordInput({
  title,
  row,
  system,
  onChange,
}: {
  title: string;
  row: MotionRow;
  system: UnitSystem;
  onChange: (patch: Partial<MotionRow>) => void;
}) {
  const [pickError, setPickError] = useState<string | null>(null);
  const parsed = useMemo(
    () => (row.recordText.trim() ? parseRecord(row.recordText, row.recordColumn) : null),
    [row.recordText, row.recordColumn],
  );

  const pick = async () => {
    setPickError(null);
    const res = await DocumentPicker.getDocumentAsync({
      type: ['.csv', '.txt', 'text/csv', 'text/plain', 'text/tab-separated-values'],
      copyToCacheDirectory: true,
      multiple: false,
    });
    const asset = res.canceled ? undefined : res.assets?.[0];
    if (!asset) return;
    if (asset.size && asset.size > MAX_FILE_BYTES) {
      setPickError(`${asset.name} is larger than 4 MB: that is not one ride cycle's record.`);
      return;
    }
    try {
      onChange({ recordText: await readPickedFile(asset), recordName: asset.name });
    } catch {
      setPickError(`${asset.name} could not be read.`);
    }
  };

  return (
    <View style={styles.root}>
      <Segmented<RecordColumn>
        label={`${title}: what the second column holds`}
        value={row.recordColumn}
        onChange={(recordColumn) => onChange({ recordColumn })}
        options={(['angle_deg', 'rate_rpm', 'rate_deg_s'] as const).map((c) => ({
          value: c,
          label: recordColumnLabel[c],
        }))}
      />
      <TextField
        label="Record: time (s), then the value"
        value={row.recordText}
        onChangeText={(recordText) => onChange({ recordText, recordName: '' })}
        multiline
        numberOfLines={6}
        placeholder={'time,angle\n0.00,12.5\n0.01,12.9\n…'}
        autoCapitalize="none"
        autoCorrect={false}
        spellCheck={false}
        style={styles.record}
        hint="One sample a line; comma, semicolon or tab between the columns; header lines are skipped."
      />
      <View style={styles.pickRow}>
        <Button label="Pick a .csv or .txt file" tone="quiet" onPress={pick} />
        {row.recordName ? (
          <Text variant="small" muted>
            From {row.recordName}
          </Text>
        ) : null}
      </View>
      {pickError ? <Text color={colors.danger}>{pickError}</Text> : null}
      <RecordSummary parsed={parsed} system={system} />
      {row.kind === 'measured' && row.recordColumn !== 'angle_deg' ? (
        <TextField
          label="Angle at the first sample"
          unit="°"
          value={row.angleDeg}
          onChangeText={(angleDeg) => onChange({ angleDeg })}
          inputMode="decimal"
          keyboardType="numbers-and-punctuation"
          hint="A rate record does not say where the joint was; 0° is the design's zero."
        />
      ) : null}
      <Segmented<Smoothing>
        label={`${title}: smoothing`}
        value={row.smoothing}
        onChange={(smoothing) => onChange({ smoothing })}
        options={[
          { value: 'auto', label: 'Smoothing: automatic' },
          { value: 'cutoff', label: 'Cut-off I choose' },
        ]}
      />
      {row.smoothing === 'cutoff' ? (
        <TextField
          label="Cut-off frequency"
          unit="Hz"
          value={row.cutoffHz}
          onChangeText={(cutoffHz) => onChange({ cutoffHz })}
          inputMode="decimal"
          keyboardType="numbers-and-punctuation"
          hint="Motion faster than this is taken for noise and smoothed away."
        />
      ) : (
        <Text variant="small" muted>
          The cut-off is chosen from the record (its sample rate, noise and the motion’s own frequencies); the
          result says which was used.
        </Text>
      )}
    </View>
  );
}

function RecordSummary({
  parsed,
  system,
}: {
  parsed: ReturnType<typeof parseRecord> | null;
  system: UnitSystem;
}) {
  if (!parsed) return null;
  if (!parsed.ok)
    return (
      <View style={styles.problems} role="alert">
        {parsed.problems.map((p) => (
          <Text key={`${p.line}${p.message}`} variant="small" color={colors.danger}>
            {p.message}
          </Text>
        ))}
      </View>
    );
  const d = describeRecord(parsed);
  return (
    <Text variant="small" muted>
      {d.samples} samples over {formatValue(d.spanS, 'time', system)}, about{' '}
      {formatValue(d.rateHz, 'frequency', system)}
      {parsed.headerLines
        ? ` · ${parsed.headerLines} header line${parsed.headerLines > 1 ? 's' : ''} skipped`
        : ''}
    </Text>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.sm },
  record: { fontFamily: fonts.mono, fontSize: 14, minHeight: 120, textAlignVertical: 'top' },
  pickRow: { flexDirection: 'row', alignItems: 'center', gap: space.md, flexWrap: 'wrap' },
  problems: { gap: 2 },
});
