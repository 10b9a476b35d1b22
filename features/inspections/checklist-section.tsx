import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import type { Draft } from '@/features/inspections/draft';
import { type CheckResult, checkResultLabel } from '@/features/inspections/schema';
import type { ChecklistTemplate } from '@/features/registry/schema';
import { type UnitSystem, displayUnits, fromSI, toSI } from '@/features/units';
import { formatTyped, normaliseEntered } from '@/lib/measured-format';

type Props = {
  draft: Draft;
  template: ChecklistTemplate | null;
  system: UnitSystem;
  onAnswer: (itemId: string, patch: Partial<Draft['checklist'][number]>) => void;
  /** Takes a photo tied to the item. */
  onPhoto: (itemId: string) => void;
};

const resultStyle: Record<CheckResult, { bg: string; fg: string }> = {
  pass: { bg: colors.within, fg: colors.baseText },
  fail: { bg: colors.over, fg: colors.baseText },
  na: { bg: colors.textMuted, fg: colors.baseText },
};

/** The checklist by area: each item answered pass / fail / not applicable, with a note and a value. */
export function ChecklistSection({ draft, template, system, onAnswer, onPhoto }: Props) {
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
              />
            ))}
        </View>
      ))}
    </View>
  );
}

function ItemCard({
  answer,
  item,
  system,
  photos,
  onAnswer,
  onPhoto,
}: {
  answer: Draft['checklist'][number];
  item: NonNullable<ChecklistTemplate>['version']['content']['areas'][number]['items'][number] | undefined;
  system: UnitSystem;
  photos: number;
  onAnswer: (patch: Partial<Draft['checklist'][number]>) => void;
  onPhoto: () => void;
}) {
  const [noteOpen, setNoteOpen] = useState(!!answer.note);
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
  const saveValue = (text: string) => {
    setValueText(text);
    const entered = normaliseEntered(text);
    const v = Number(entered);
    if (entered === null || !Number.isFinite(v)) return onAnswer({ measurement: null });
    onAnswer({
      measurement:
        kind && unit
          ? { valueSI: toSI(v, kind, unit.mathjs), unit: unit.label, entered }
          : { valueSI: v, unit: item?.measurementLabel ?? '', entered },
    });
  };
  return (
    <Card style={answer.result === 'fail' ? styles.failed : undefined}>
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
              onPress={() => {
                onAnswer({ result: selected ? null : r });
                if (r === 'fail') setNoteOpen(true);
              }}
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
        />
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
});
