import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { apiFetch } from '@/features/api';
import { EnvelopeMark } from '@/components/status-mark';
import { DisclosureToggle } from '@/components/disclosure-toggle';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { disagreeingReadings, envelopeItemOf } from '@/features/records';
import type { ChecklistAnswer } from '@/features/records/schema';
import type { EnvelopeItem } from '@/features/loads/engine';
import { registryKeys } from '@/features/registry/ui';
import { type ChecklistItem, checklistTemplateResponseSchema } from '@/features/registry/schema';
import type { InspectionPhoto, InspectionReading } from '@/features/review/inspection-schema';
import { PhotoThumb } from '@/features/review/photo-gallery';
import { formatMeasurement } from '@/features/review/review-format';
import type { UnitSystem } from '@/lib/units';
import { formatAgainstLimit } from '@/lib/measured-format';

type Result = ChecklistAnswer['result'];

/** Each answer's word and shape: a failed item is never told apart by colour alone. */
const resultInfo: Record<
  'pass' | 'fail' | 'na' | 'none',
  { label: string; icon: 'check' | 'x' | 'minus' | 'help-circle'; color: string }
> = {
  fail: { label: 'Failed', icon: 'x', color: colors.over },
  pass: { label: 'Passed', icon: 'check', color: colors.within },
  na: { label: 'Not applicable', icon: 'minus', color: colors.textMuted },
  none: { label: 'Not answered', icon: 'help-circle', color: colors.near },
};
const keyOf = (r: Result) => r ?? 'none';

type Checked = {
  /** Where the value stands in the server's envelope; undefined when it had no limit to meet. */
  envelopeItem?: EnvelopeItem;
  /** Readings of the same pivot quantity holding another value (records from before values were shared). */
  disagree: InspectionReading[];
};

/**
 * The checklist as answered. Failed items and values over their limits come first, each with the
 * inspector's note or reason, the measurement against its limit and its photos; the rest are counted, and
 * listed on request, each measured value still beside its limit and status.
 */
export function ChecklistResults({
  checklist,
  photos,
  onOpenPhoto,
  envelope = [],
  readings = [],
  template,
  system = 'si',
}: {
  checklist: ChecklistAnswer[];
  photos: InspectionPhoto[];
  onOpenPhoto: (photoId: string) => void;
  /** The server's analysis envelope, which holds the checklist values' statuses. */
  envelope?: readonly EnvelopeItem[];
  readings?: InspectionReading[];
  /** The template version answered, to compare old records' values with their readings. */
  template?: { id: string | null; version: number | null };
  system?: UnitSystem;
}) {
  const [showAll, setShowAll] = useState(false);
  const items = useTemplateItems(template);
  if (checklist.length === 0) return <Text muted>This inspection has no checklist answers.</Text>;
  const checked = new Map<string, Checked>(
    checklist.map((a) => [
      a.itemId,
      {
        envelopeItem: a.measurement ? envelopeItemOf(a, envelope, readings) : undefined,
        disagree: disagreeingReadings(
          items.get(a.itemId),
          a,
          readings as never,
        ) as unknown as InspectionReading[],
      },
    ]),
  );
  const needsEye = (a: ChecklistAnswer) =>
    a.result === 'fail' ||
    checked.get(a.itemId)?.envelopeItem?.status === 'over' ||
    !!checked.get(a.itemId)?.disagree.length;
  const failed = checklist.filter(needsEye);
  const rest = checklist.filter((a) => !needsEye(a));
  const count = (r: Result) => checklist.filter((a) => a.result === r).length;
  const overCount = checklist.filter((a) => checked.get(a.itemId)?.envelopeItem?.status === 'over').length;
  const tally = [
    `${count('fail')} failed`,
    `${count('pass')} passed`,
    count('na') ? `${count('na')} not applicable` : null,
    count(null) ? `${count(null)} not answered` : null,
    overCount ? `${overCount} over its limit` : null,
  ]
    .filter(Boolean)
    .join(' · ');
  return (
    <View style={styles.root}>
      <Text variant="figure">{tally}</Text>
      {failed.length === 0 ? <Text muted>No item was marked failed or is over its limit.</Text> : null}
      {failed.map((a) => (
        <Card
          key={a.itemId}
          style={styles.failed}
          accessibilityLabel={`${a.result === 'fail' ? 'Failed item' : 'Item over its limit'}: ${a.text}`}
        >
          <ResultMark result={a.result} />
          {a.area ? (
            <Text variant="label" muted>
              {a.area.toUpperCase()}
            </Text>
          ) : null}
          <Text variant="heading">{a.text}</Text>
          {a.note ? (
            <Text>{a.note}</Text>
          ) : a.result === 'fail' ? (
            <Text muted>No note from the inspector.</Text>
          ) : null}
          <MeasuredLine answer={a} checked={checked.get(a.itemId)} system={system} />
          <ItemPhotos itemId={a.itemId} photos={photos} onOpen={onOpenPhoto} />
        </Card>
      ))}
      {rest.length > 0 ? (
        <DisclosureToggle
          open={showAll}
          onToggle={() => setShowAll((v) => !v)}
          label={showAll ? 'Hide the other items' : `Show the other ${rest.length} items`}
        />
      ) : null}
      {showAll ? (
        <View style={styles.list} role="list">
          {rest.map((a) => (
            <View key={a.itemId} style={styles.line} role="listitem">
              <ResultMark result={a.result} />
              <View style={styles.lineText}>
                <Text>{a.text}</Text>
                {a.note ? (
                  <Text variant="small" muted>
                    {a.note}
                  </Text>
                ) : null}
                <MeasuredLine answer={a} checked={checked.get(a.itemId)} system={system} small />
              </View>
              <ItemPhotos itemId={a.itemId} photos={photos} onOpen={onOpenPhoto} small />
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

/** The answered version's items; empty while loading or when the template cannot be read. */
function useTemplateItems(template: { id: string | null; version: number | null } | undefined) {
  const id = template?.id ?? '';
  const version = template?.version ?? 0;
  const query = useQuery({
    queryKey: registryKeys.checklistVersion(id, version),
    queryFn: async () =>
      (
        await apiFetch(`/api/checklist-templates/${encodeURIComponent(id)}/versions/${version}`, {
          schema: checklistTemplateResponseSchema,
        })
      ).template,
    enabled: id !== '' && version > 0,
    // Versions never change; a template the desk cannot read only hides the comparison of old records.
    staleTime: Infinity,
    retry: false,
  });
  return new Map<string, ChecklistItem>(
    (query.data?.version.content.areas ?? []).flatMap((a) => a.items.map((i) => [i.id, i] as const)),
  );
}

/** A measured value against its limit, with its status; the inspector's reason when passed over it. */
function MeasuredLine({
  answer,
  checked,
  system,
  small,
}: {
  answer: ChecklistAnswer;
  checked: Checked | undefined;
  system: UnitSystem;
  small?: boolean;
}) {
  const m = answer.measurement;
  if (!m) return null;
  const e = checked?.envelopeItem;
  const shown = e
    ? formatAgainstLimit(m.valueSI, e.limit, e.quantity, system, { entered: m.entered, unit: m.unit })
    : null;
  return (
    <View style={styles.measured}>
      <View style={styles.measuredRow}>
        {e ? <EnvelopeMark status={e.status} compact={small} /> : null}
        <Text variant={small ? 'small' : 'figure'}>
          Measured {shown ? `${shown.value} against ${shown.limit}` : formatMeasurement(m)}
          {!e ? ' · no limit checked' : ''}
        </Text>
      </View>
      {answer.overLimitReason ? (
        <Text variant="small" color={colors.over}>
          Passed over its limit. Inspector’s reason: {answer.overLimitReason}
        </Text>
      ) : null}
      {checked?.disagree.map((r) => (
        <Text key={r.id} variant="small" color={colors.near}>
          Disagrees with the reading “{r.label}”: {formatMeasurement(r)}. The record holds both values.
        </Text>
      ))}
    </View>
  );
}

function ResultMark({ result }: { result: Result }) {
  const info = resultInfo[keyOf(result)];
  return (
    <View style={styles.mark} accessibilityLabel={info.label}>
      <Feather name={info.icon} size={16} color={info.color} />
      <Text variant="label" color={info.color}>
        {info.label}
      </Text>
    </View>
  );
}

function ItemPhotos({
  itemId,
  photos,
  onOpen,
  small,
}: {
  itemId: string;
  photos: InspectionPhoto[];
  onOpen: (photoId: string) => void;
  small?: boolean;
}) {
  const mine = photos.filter((p) => p.checklistItemId === itemId);
  if (mine.length === 0) return null;
  return (
    <View style={styles.photos}>
      {mine.map((p) => (
        <PhotoThumb key={p.id} photo={p} onOpen={onOpen} size={small ? 56 : 96} />
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.md },
  failed: { borderLeftWidth: 4, borderLeftColor: colors.over },
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    alignSelf: 'flex-start',
    minWidth: 130,
  },
  list: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    paddingHorizontal: space.md,
  },
  line: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  lineText: { flex: 1, minWidth: 180, gap: 2 },
  measured: { gap: 2 },
  measuredRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  photos: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
