import { randomUUID } from 'expo-crypto';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import {
  type ReadingTarget,
  enterChecklistValue,
  sharedReadingTitle,
  checklistValueStatus,
  isGap,
  readingLink,
  resolveLimit,
  type Draft,
} from '@/features/records';
import {
  MeasuredWithPicker,
  type MeasuredWith,
  measuredWithProblem,
  nothingChosen,
  snapshotOf,
} from '@/features/instruments/ui';
import { type Instrument, measuredWithWords } from '@/features/instruments/schema';
import { localDay } from '@/lib/dates';
import type { DesignData } from '@/features/loads/design-schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import {
  type AgainstLimit,
  formatAgainstLimit,
  formatLimitOnly,
  formatTyped,
  normaliseEntered,
} from '@/lib/measured-format';
import {
  type DisplayUnit,
  type QuantityKind,
  type UnitSystem,
  displayUnits,
  fromSI,
  toSI,
} from '@/lib/units';

type Item = NonNullable<ChecklistTemplate>['version']['content']['areas'][number]['items'][number];
type Answer = Draft['checklist'][number];
type Measurement = Omit<NonNullable<Answer['measurement']>, 'readingId'>;
/** An item's value against its limit on this ride (null without a value or a limit). */
type ValueCheck = ReturnType<typeof checklistValueStatus>;

/**
 * An item's measured value: typed in the display unit, checked against its limit as it is typed, and,
 * where it is also a pivot's reading, kept as that reading once the inspector says how it was measured.
 */
export function ChecklistValue({
  answer,
  item,
  system,
  onAnswer,
  design,
  instruments,
  reading,
  onDraft,
  check,
}: {
  answer: Answer;
  item: Item | undefined;
  system: UnitSystem;
  onAnswer: (patch: Partial<Answer>) => void;
  design: DesignData | null;
  instruments: Instrument[];
  /** The pivot reading this value is, once there is one. */
  reading: Draft['readings'][number] | undefined;
  onDraft?: (update: (d: Draft) => Draft) => void;
  check: ValueCheck;
}) {
  const [measured, setMeasured] = useState<MeasuredWith>(nothingChosen);
  const [measuredError, setMeasuredError] = useState<string | undefined>();
  const kind = item?.measurementKind && item.measurementKind !== 'count' ? item.measurementKind : null;
  const unit = kind ? displayUnits(kind, system)[0] : null;
  const [valueText, setValueText] = useState(() => typedText(answer, kind, unit));
  const target = item && onDraft ? readingTarget(item, design) : null;
  const resolved = item ? resolveLimit(item, design) : null;
  const status = check && !isGap(check) ? check.status : null;

  /** The value and, for a shared quantity, its reading, in one change. */
  const store = (measurement: Measurement | null, by = measured) => {
    if (!target || !onDraft) return onAnswer({ measurement });
    const ready = measuredWithProblem(by, localDay()) === null && by.method;
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
  const measurementOf = (text: string) => measurementFromText(text, item, design, kind, unit);
  const saveValue = (text: string) => {
    setValueText(text);
    store(measurementOf(text));
  };
  const shown = againstLimit(check, answer.measurement, system);

  return (
    <>
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
        <PivotReading
          target={target}
          reading={reading}
          instruments={instruments}
          measured={measured}
          error={measuredError}
          onMeasured={(m) => {
            setMeasured(m);
            const problem = measuredWithProblem(m, localDay());
            setMeasuredError(m.method && m.instrument !== undefined ? (problem ?? undefined) : undefined);
            if (!problem) store(measurementOf(valueText), m);
          }}
        />
      ) : null}
    </>
  );
}

/** The pivot reading the value also is: kept with how it was measured, or asking how it was measured. */
function PivotReading({
  target,
  reading,
  instruments,
  measured,
  error,
  onMeasured,
}: {
  target: ReadingTarget;
  reading: Draft['readings'][number] | undefined;
  instruments: Instrument[];
  measured: MeasuredWith;
  error: string | undefined;
  onMeasured: (m: MeasuredWith) => void;
}) {
  return reading ? (
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
        today={localDay()}
        value={measured}
        onChange={onMeasured}
        error={error}
      />
    </View>
  );
}

/** The inspector's own digits come back as typed ("0.40", never "0.40000"). */
function typedText(answer: Answer, kind: QuantityKind | null, unit: DisplayUnit | null): string {
  return answer.measurement?.entered && answer.measurement.unit === (unit?.label ?? answer.measurement.unit)
    ? answer.measurement.entered
    : answer.measurement && unit && kind
      ? formatTyped(fromSI(answer.measurement.valueSI, kind, unit.mathjs))
      : answer.measurement
        ? String(answer.measurement.valueSI)
        : '';
}

/** The pivot reading the item's value also is. Shared only where the ride has that pivot. */
function readingTarget(item: Item, design: DesignData | null): ReadingTarget | null {
  const linked = readingLink(item);
  const link = linked && design?.pivots.some((p) => p.joint === linked.joint) ? linked : null;
  return link
    ? {
        ...link,
        label: `${design?.bodies[link.joint]?.name ?? `Pivot ${link.joint + 1}`}: ${sharedReadingTitle[link.kind] ?? link.kind}`,
      }
    : null;
}

/** The measurement typed text stands for (null when it is not a number), with its status at entry. */
function measurementFromText(
  text: string,
  item: Item | undefined,
  design: DesignData | null,
  kind: QuantityKind | null,
  unit: DisplayUnit | null,
): Measurement | null {
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
}

/** The stored value against its limit, in the units the inspector typed it in. */
function againstLimit(
  check: ValueCheck,
  measurement: Answer['measurement'],
  system: UnitSystem,
): AgainstLimit | null {
  return check && !isGap(check) && measurement
    ? formatAgainstLimit(measurement.valueSI, check.resolved.limit, check.resolved.quantity, system, {
        entered: measurement.entered,
        unit: measurement.unit,
      })
    : null;
}

const styles = StyleSheet.create({
  status: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  statusText: { flexShrink: 1 },
  measured: { gap: space.sm },
});
