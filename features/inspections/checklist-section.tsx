import { randomUUID } from 'expo-crypto';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import {
  type ReadingTarget,
  enterChecklistValue,
  sharedReadingTitle,
} from '@/features/inspections/checklist-entry';
import {
  checklistValueStatus,
  isGap,
  readingLink,
  resolveLimit,
} from '@/features/inspections/checklist-limits';
import type { Draft } from '@/features/inspections/draft';
import { type CheckResult, checkResultLabel } from '@/features/inspections/schema';
import {
  MeasuredWithPicker,
  type MeasuredWith,
  measuredWithProblem,
  nothingChosen,
  snapshotOf,
} from '@/features/instruments/measured-with';
import { type Instrument, measuredWithWords, utcDate } from '@/features/instruments/schema';
import type { DesignData } from '@/features/loads/design-schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { type UnitSystem, displayUnits, fromSI, toSI } from '@/lib/units';
import { formatAgainstLimit, formatLimitOnly, formatTyped, normaliseEntered } from '@/lib/measured-format';

type Props = {
  draft: Draft;
  template: ChecklistTemplate | null;
  system: UnitSystem;
  onAnswer: (itemId: string, patch: Partial<Draft['checklist'][number]>) => void;
  /** Takes a photo tied to the item. */
  onPhoto: (itemId: string) => void;
  /** The ride's design data, whose pivot limits the values are checked against at entry. */
  design?: DesignData | null;
  /** The instrument register, for values that are also a pivot's reading. */
  instruments?: Instrument[];
  /** One change of the whole draft (an answer and its reading together); without it values stay unshared. */
  onDraft?: (update: (d: Draft) => Draft) => void;
};

const resultStyle: Record<CheckResult, { bg: string; fg: string }> = {
  pass: { bg: colors.within, fg: colors.baseText },
  fail: { bg: colors.over, fg: colors.baseText },
  na: { bg: colors.textMuted, fg: colors.baseText },
};

/** The checklist by area: each item answered pass / fail / not applicable, with a note and a value. */
export function ChecklistSection({
  draft,
  template,
  system,
  onAnswer,
  onPhoto,
  design = null,
  instruments = [],
  onDraft,
}: Props) {
  const items = new Map(
    (template?.version.content.areas ?? []).flatMap((a) => a.items.map((i) => [i.id, i] as const)),
  );
  const areas = [...new Set(draft.checklist.map((a) => a.area))];
  if (draft.checklist.length === 0)
    return (
      <Card>
        <Text muted>
          No checklist template for this ride class. Record readings and photos, and use the notes.
        </Text>
      </Card>
    );
  return (
    <View style={styles.root}>
      {areas.map((area) => (
        <View key={area} style={styles.area}>
          <Text variant="label" muted accessibilityRole="header">
            {area.toUpperCase()}
          </Text>
          {draft.checklist
            .filter((a) => a.area === area)
            .map((answer) => (
              <ItemCard
                key={answer.itemId}
                answer={answer}
                item={items.get(answer.itemId)}
                system={system}
                photos={draft.photos.filter((p) => p.checklistItemId === answer.itemId).length}
                onAnswer={(patch) => onAnswer(answer.itemId, patch)}
                onPhoto={() => onPhoto(answer.itemId)}
                design={design}
                instruments={instruments}
                reading={draft.readings.find((r) => r.id === answer.measurement?.readingId)}
                onDraft={onDraft}
              />
            ))}
        </View>
      ))}
    </View>
  );
}

type Item = NonNullable<ChecklistTemplate>['version']['content']['areas'][number]['items'][number];
type Answer = Draft['checklist'][number];

function ItemCard({
  answer,
  item,
  system,
  photos,
  onAnswer,
  onPhoto,
  design,
  instruments,
  reading,
  onDraft,
}: {
  answer: Answer;
  item: Item | undefined;
  system: UnitSystem;
  photos: number;
  onAnswer: (patch: Partial<Answer>) => void;
  onPhoto: () => void;
  design: DesignData | null;
  instruments: Instrument[];
  /** The pivot reading this value is, once there is one. */
  reading: Draft['readings'][number] | undefined;
  onDraft?: Props['onDraft'];
}) {
  const [noteOpen, setNoteOpen] = useState(!!answer.note);
  // Asked for when Pass is chosen on a value over its limit; kept open while the answer is such a Pass.
  const [reasonAsked, setReasonAsked] = useState(false);
  const [measured, setMeasured] = useState<MeasuredWith>(nothingChosen);
  const [measuredError, setMeasuredError] = useState<string | undefined>();
  const kind = item?.measurementKind && item.measurementKind !== 'count' ? item.measurementKind : null;
  const unit = kind ? displayUnits(kind, system)[0] : null;
  // The inspector's own digits come back as typed ("0.40", never "0.40000").
  const [valueText, setValueText] = useState(() =>
    answer.measurement?.entered && answer.measurement.unit === (unit?.label ?? answer.measurement.unit)
      ? answer.measurement.entered
      : answer.measurement && unit && kind
        ? formatTyped(fromSI(answer.measurement.valueSI, kind, unit.mathjs))
        : answer.measurement
          ? String(answer.measurement.valueSI)
          : '',
  );
  // Shared only where the ride has that pivot: a reading must belong to one of its joints.
  const linked = item && onDraft ? readingLink(item) : null;
  const link = linked && design?.pivots.some((p) => p.joint === linked.joint) ? linked : null;
  const target: ReadingTarget | null = link
    ? {
        ...link,
        label: `${design?.bodies[link.joint]?.name ?? `Pivot ${link.joint + 1}`}: ${sharedReadingTitle[link.kind] ?? link.kind}`,
      }
    : null;
  const resolved = item ? resolveLimit(item, design) : null;
  const check =
    item && answer.measurement ? checklistValueStatus(item, design, answer.measurement.valueSI) : null;
  const status = check && !isGap(check) ? check.status : null;
  const over = status === 'over';

  /** The value and, for a shared quantity, its reading, in one change. */
  const store = (
    measurement: Omit<NonNullable<Answer['measurement']>, 'readingId'> | null,
    by = measured,
  ) => {
    if (!target || !onDraft) return onAnswer({ measurement });
    const ready = measuredWithProblem(by, utcDate(new Date())) === null && by.method;
    const measuredBy =
      ready && by.method
        ? { method: by.method, instrument: by.instrument ? snapshotOf(by.instrument) : null }
        : null;
    onDraft((d) =>
      enterChecklistValue(d, {
        itemId: answer.itemId,
        measurement,
        target,
        measuredBy,
        now: new Date(),
        newId: randomUUID,
      }),
    );
  };
  const measurementOf = (text: string) => {
    const entered = normaliseEntered(text);
    const v = Number(entered);
    if (entered === null || !Number.isFinite(v)) return null;
    const valueSI = kind && unit ? toSI(v, kind, unit.mathjs) : v;
    const seen = item ? checklistValueStatus(item, design, valueSI) : null;
    return {
      valueSI,
      unit: kind && unit ? unit.label : (item?.measurementLabel ?? ''),
      entered,
      ...(seen && !isGap(seen) ? { status: seen.status } : {}),
    };
  };
  const saveValue = (text: string) => {
    setValueText(text);
    store(measurementOf(text));
  };
  const choose = (r: CheckResult) => {
    const selected = answer.result === r;
    if (r === 'pass' && !selected && over && !answer.overLimitReason?.trim()) {
      // Not marked yet: the reason comes first, so a Pass on a value over its limit never stands bare.
      setReasonAsked(true);
      return;
    }
    onAnswer({ result: selected ? null : r });
    if (r === 'fail') {
      setNoteOpen(true);
      setReasonAsked(false);
    }
  };
  const askReason = over && (reasonAsked || answer.result === 'pass');
  const shown =
    check && !isGap(check) && answer.measurement
      ? formatAgainstLimit(
          answer.measurement.valueSI,
          check.resolved.limit,
          check.resolved.quantity,
          system,
          {
            entered: answer.measurement.entered,
            unit: answer.measurement.unit,
          },
        )
      : null;

  return (
    <Card style={answer.result === 'fail' || over ? styles.failed : undefined}>
      <Text variant="heading">{answer.text}</Text>
      {item?.guidance ? (
        <Text variant="small" muted>
          {item.guidance}
        </Text>
      ) : null}
      {item?.photoRequired || item?.measurementRequired ? (
        <Text variant="small" color={colors.accent}>
          {[
            item.photoRequired ? `Photo required (${photos} taken)` : null,
            item.measurementRequired ? 'Measurement required' : null,
          ]
            .filter(Boolean)
            .join(' · ')}
        </Text>
      ) : null}
      <View style={styles.results} role="radiogroup" accessibilityLabel={`Result for ${answer.text}`}>
        {(['pass', 'fail', 'na'] as const).map((r) => {
          const selected = answer.result === r;
          return (
            <Pressable
              key={r}
              role="radio"
              aria-checked={selected}
              accessibilityLabel={`${checkResultLabel[r]}: ${answer.text}`}
              onPress={() => choose(r)}
              style={StyleSheet.flatten([
                styles.result,
                selected && { backgroundColor: resultStyle[r].bg, borderColor: resultStyle[r].bg },
              ])}
            >
              <Text variant="heading" color={selected ? resultStyle[r].fg : colors.text}>
                {r === 'na' ? 'N/A' : checkResultLabel[r]}
              </Text>
            </Pressable>
          );
        })}
      </View>
      {item?.measurementRequired || answer.measurement ? (
        <TextField
          label={item?.measurementLabel ?? 'Measured value'}
          unit={unit?.label ?? item?.measurementLabel ?? undefined}
          value={valueText}
          onChangeText={saveValue}
          inputMode="decimal"
          hint={
            resolved && !isGap(resolved) && !shown
              ? `Limit ${formatLimitOnly(resolved.limit, resolved.quantity, system)} (${resolved.source})`
              : undefined
          }
        />
      ) : null}
      {shown && status ? (
        <View style={styles.status} accessibilityLiveRegion="polite">
          <EnvelopeMark status={status} />
          <Text variant="small" style={styles.statusText}>
            <Text variant="figure">{shown.value}</Text> against {shown.limit}
            <Text variant="small" muted>
              {' '}
              ({check && !isGap(check) ? check.resolved.source : ''})
            </Text>
          </Text>
        </View>
      ) : null}
      {check && isGap(check) ? (
        <Text variant="small" color={colors.near}>
          Not checked: {check.gap}.
        </Text>
      ) : null}
      {target && answer.measurement ? (
        reading ? (
          <Text variant="small" muted>
            Kept as the reading “{reading.label}” · {measuredWithWords(reading)}
          </Text>
        ) : (
          <View style={styles.measured}>
            <Text variant="small">
              This value is also the pivot’s reading. Say how it was measured to keep it there.
            </Text>
            <MeasuredWithPicker
              kind={target.kind}
              instruments={instruments}
              today={utcDate(new Date())}
              value={measured}
              onChange={(m) => {
                setMeasured(m);
                const problem = measuredWithProblem(m, utcDate(new Date()));
                setMeasuredError(m.method && m.instrument !== undefined ? (problem ?? undefined) : undefined);
                if (!problem) store(measurementOf(valueText), m);
              }}
              error={measuredError}
            />
          </View>
        )
      ) : null}
      {askReason ? (
        <View style={styles.reason} role="alert">
          <Text variant="heading" color={colors.over}>
            Over its limit
          </Text>
          <Text variant="small">
            Mark it Fail, or say why this item still passes. Your reason goes with the record to the reviewer.
          </Text>
          <TextField
            label="Reason for passing a value over its limit"
            value={answer.overLimitReason ?? ''}
            onChangeText={(overLimitReason) => onAnswer({ overLimitReason })}
            multiline
            error={
              answer.result === 'pass' && !answer.overLimitReason?.trim() ? 'A reason is needed' : undefined
            }
          />
          <View style={styles.reasonActions}>
            <Button
              label="Pass with this reason"
              tone="quiet"
              disabled={!answer.overLimitReason?.trim()}
              onPress={() => {
                onAnswer({ result: 'pass' });
                setReasonAsked(false);
              }}
            />
            <Button
              label="Mark Fail"
              tone="accent"
              onPress={() => {
                onAnswer({ result: 'fail' });
                setNoteOpen(true);
                setReasonAsked(false);
              }}
            />
          </View>
        </View>
      ) : null}
      {item?.photoRequired || answer.result === 'fail' ? (
        <Button
          label={photos > 0 ? `Add another photo (${photos})` : 'Take a photo of this'}
          tone="quiet"
          onPress={onPhoto}
          accessibilityLabel={`Photo for ${answer.text}`}
        />
      ) : null}
      {noteOpen || answer.result === 'fail' ? (
        <TextField
          label={answer.result === 'fail' ? 'What is wrong' : 'Note'}
          value={answer.note ?? ''}
          onChangeText={(note) => onAnswer({ note })}
          multiline
        />
      ) : (
        <Pressable onPress={() => setNoteOpen(true)} accessibilityRole="button" style={styles.addNote}>
          <Text variant="small" color={colors.accent}>
            + Add a note
          </Text>
        </Pressable>
      )}
    </Card>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.xl },
  area: { gap: space.sm },
  failed: { borderColor: colors.over, borderWidth: 2 },
  results: { flexDirection: 'row', gap: space.sm },
  result: {
    flex: 1,
    minHeight: layout.touchTarget + 4,
    alignItems: 'center',
    justifyContent: 'center',
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  addNote: { minHeight: 36, justifyContent: 'center' },
  status: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  statusText: { flexShrink: 1 },
  measured: { gap: space.sm },
  reason: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.over,
    backgroundColor: colors.overSoft,
  },
  reasonActions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
