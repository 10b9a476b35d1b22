import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { SelectField } from '@/components/select-field';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import type { z } from 'zod';

import {
  type ChecklistLimit,
  checklistLimitSchema,
  type DesignLimitQuantity,
  type MeasurementKind,
  designLimitKind,
  designLimitQuantities,
} from '@/features/registry/schema';
import { type UnitSystem, displayUnits, fromSI, toSI } from '@/lib/units';
import { formatStated, formatTyped, normaliseEntered } from '@/lib/measured-format';

/** What a measured item is checked against, in the words the admin picks from. */
const designLimitLabel: Record<DesignLimitQuantity, string> = {
  pin_diameter: 'Pin minimum diameter (design data)',
  clearance: 'Bushing clearance limit (design data)',
  speed: 'Speed limit (design data)',
  amplitude: 'Swing amplitude limit (design data)',
};

/** As the form holds it: the template kind's optional fields may still be missing. */
type ChecklistLimitInput = z.input<typeof checklistLimitSchema>;

type Choice = 'none' | 'template' | `design:${DesignLimitQuantity}`;
const PIVOTS = Array.from({ length: 10 }, (_, j) => j);
const pivotWords = (j: number) => `Pivot ${j + 1}${j === 0 ? ' (the ground pivot)' : ''}`;

/** A limit in words for the template's page: "≥ design minimum of pivot 1", "0.25 mm to 0.75 mm". */
export function limitWords(
  limit: ChecklistLimit | null | undefined,
  kind: MeasurementKind | null,
  system: UnitSystem,
): string | null {
  if (!limit) return null;
  if (limit.source === 'design')
    return `${designLimitLabel[limit.quantity].replace(' (design data)', '')} of pivot ${limit.joint + 1}, from each ride’s design data`;
  if (!kind || kind === 'count') return null;
  const f = (v: number) => formatStated(v, kind, system).text;
  const range =
    limit.min !== null && limit.max !== null
      ? `${f(limit.min)} to ${f(limit.max)}`
      : limit.min !== null
        ? `≥ ${f(limit.min)}`
        : `≤ ${f(limit.max as number)}`;
  return `${range}${limit.joint !== null ? ` at pivot ${limit.joint + 1}` : ''} (written in the template)`;
}

/**
 * The limit of one measured item: none, one of a pivot's design limits (offered for the kinds that fit),
 * or a minimum and/or maximum typed in the admin's units and kept in SI.
 */
export function ChecklistLimitField({
  value,
  onChange,
  kind,
  system,
  error,
}: {
  value: ChecklistLimitInput | null | undefined;
  onChange: (v: ChecklistLimitInput | null) => void;
  kind: MeasurementKind | null | undefined;
  system: UnitSystem;
  error?: string;
}) {
  const wide = useWide();
  const quantity = kind && kind !== 'count' ? kind : null;
  const unit = quantity ? displayUnits(quantity, system)[0] : null;
  const shown = (si: number | null | undefined) =>
    si === null || si === undefined || !unit || !quantity
      ? ''
      : formatTyped(fromSI(si, quantity, unit.mathjs));
  const [minText, setMinText] = useState(() => (value?.source === 'template' ? shown(value.min) : ''));
  const [maxText, setMaxText] = useState(() => (value?.source === 'template' ? shown(value.max) : ''));
  const choice: Choice = !value
    ? 'none'
    : value.source === 'template'
      ? 'template'
      : `design:${value.quantity}`;
  const fitting = designLimitQuantities.filter((q) => designLimitKind[q] === kind);
  const options: { value: Choice; label: string }[] = [
    { value: 'none', label: 'No limit: the value is only recorded' },
    ...fitting.map((q) => ({ value: `design:${q}` as Choice, label: designLimitLabel[q] })),
    ...(unit ? [{ value: 'template' as Choice, label: 'A limit written here (min and/or max)' }] : []),
  ];
  const toSi = (text: string) => {
    const t = normaliseEntered(text);
    return t === null || !unit || !quantity ? null : toSI(Number(t), quantity, unit.mathjs);
  };
  const joint = value?.joint ?? null;

  return (
    <View style={styles.root}>
      <View style={wide ? styles.row : styles.stack}>
        <View style={wide ? styles.flex : undefined}>
          <SelectField<Choice>
            label="Checked against"
            value={choice}
            options={options}
            onChange={(c) => {
              if (c === 'none') return onChange(null);
              if (c === 'template')
                return onChange({ source: 'template', joint, min: toSi(minText), max: toSi(maxText) });
              onChange({
                source: 'design',
                joint: joint ?? 0,
                quantity: c.slice('design:'.length) as DesignLimitQuantity,
              });
            }}
          />
        </View>
        {value ? (
          <View style={wide ? styles.flex : undefined}>
            <SelectField<string>
              label="Pivot"
              value={joint === null ? 'none' : String(joint)}
              options={[
                ...(value.source === 'template' ? [{ value: 'none', label: 'Not a pivot’s value' }] : []),
                ...PIVOTS.map((j) => ({ value: String(j), label: pivotWords(j) })),
              ]}
              onChange={(v) => {
                const j = v === 'none' ? null : Number(v);
                onChange(value.source === 'design' ? { ...value, joint: j ?? 0 } : { ...value, joint: j });
              }}
            />
          </View>
        ) : null}
      </View>
      {value?.source === 'template' ? (
        <View style={styles.row}>
          <View style={styles.flex}>
            <TextField
              label="Minimum"
              unit={unit?.label}
              value={minText}
              inputMode="decimal"
              onChangeText={(t) => {
                setMinText(t);
                onChange({ ...value, min: toSi(t) });
              }}
            />
          </View>
          <View style={styles.flex}>
            <TextField
              label="Maximum"
              unit={unit?.label}
              value={maxText}
              inputMode="decimal"
              onChangeText={(t) => {
                setMaxText(t);
                onChange({ ...value, max: toSi(t) });
              }}
            />
          </View>
        </View>
      ) : null}
      {value?.source === 'design' ? (
        <Text variant="small" muted>
          Each ride is checked against its own design data for this pivot; a ride without that limit shows the
          value as not checked.
        </Text>
      ) : null}
      {error ? (
        <Text variant="small" color={colors.danger} role="alert">
          {error}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'flex-end', gap: space.sm },
  stack: { gap: space.sm },
  flex: { flex: 1, minWidth: 0 },
});
