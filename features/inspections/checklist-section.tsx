import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, fonts, layout, radius, space } from '@/components/theme';
import { checklistValueStatus, isGap } from '@/features/records';
import { ChecklistValue } from '@/features/inspections/checklist-value';
import type { Draft } from '@/features/records';
import {
  type CheckResult,
  type DraftProblem,
  type PhotoRef,
  checkResultLabel,
} from '@/features/records/schema';
import type { Instrument } from '@/features/instruments/schema';
import type { DesignData } from '@/features/loads/design-schema';
import { type ChecklistTemplate, inspectionTypeLabel } from '@/features/registry/schema';
import type { UnitSystem } from '@/lib/units';

type Props = {
  draft: Draft;
  template: ChecklistTemplate | null;
  system: UnitSystem;
  onAnswer: (itemId: string, patch: Partial<Draft['checklist'][number]>) => void;
  /** Takes a photo tied to the item; without it no item offers a photo (an operator's daily check). */
  onPhoto?: (itemId: string) => void;
  /** The ride's design data, whose pivot limits the values are checked against at entry. */
  design?: DesignData | null;
  /** The instrument register, for values that are also a pivot's reading. */
  instruments?: Instrument[];
  /** One change of the whole draft (an answer and its reading together); without it values stay unshared. */
  onDraft?: (update: (d: Draft) => Draft) => void;
  /** Shows a photo taken for an item, as a thumbnail on its card. */
  Thumb?: (props: { photo: PhotoRef; size?: number; label?: string }) => React.ReactNode;
  /** Each item's card as it mounts (null as it unmounts), so a blocker can bring it into view. */
  itemRef?: (itemId: string, node: View | null) => void;
  /** The blocker the inspector came from: its item's card says what is left to do. */
  pointedAt?: DraftProblem | null;
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
  Thumb,
  itemRef,
  pointedAt,
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
  // The class had no checklist of this inspection's type, so the general one was used (pickChecklistTemplate).
  const general = template !== null && template.inspectionType !== draft.type;
  return (
    <View style={styles.root}>
      {general ? (
        <Text muted>
          No {inspectionTypeLabel[draft.type].toLowerCase()} checklist for this ride class: this is the
          class&apos;s general checklist ({template.name}).
        </Text>
      ) : null}
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
                photos={draft.photos.filter((p) => p.checklistItemId === answer.itemId)}
                Thumb={Thumb}
                itemRef={itemRef}
                pointedAt={pointedAt?.itemId === answer.itemId ? pointedAt : null}
                onAnswer={(patch) => onAnswer(answer.itemId, patch)}
                onPhoto={onPhoto ? () => onPhoto(answer.itemId) : null}
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
  onAnswer,
  onPhoto,
  design,
  instruments,
  reading,
  onDraft,
  photos: taken,
  Thumb,
  itemRef,
  pointedAt,
}: {
  answer: Answer;
  item: Item | undefined;
  system: UnitSystem;
  photos: PhotoRef[];
  Thumb?: Props['Thumb'];
  itemRef?: Props['itemRef'];
  pointedAt: DraftProblem | null;
  onAnswer: (patch: Partial<Answer>) => void;
  onPhoto: (() => void) | null;
  design: DesignData | null;
  instruments: Instrument[];
  /** The pivot reading this value is, once there is one. */
  reading: Draft['readings'][number] | undefined;
  onDraft?: Props['onDraft'];
}) {
  const photos = taken.length;
  const [noteOpen, setNoteOpen] = useState(!!answer.note);
  // Asked for when Pass is chosen on a value over its limit; kept open while the answer is such a Pass.
  const [reasonAsked, setReasonAsked] = useState(false);
  const check =
    item && answer.measurement ? checklistValueStatus(item, design, answer.measurement.valueSI) : null;
  const status = check && !isGap(check) ? check.status : null;
  const over = status === 'over';

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

  return (
    // The card's frame is what a blocker brings into view and focuses.
    <View
      ref={(node) => itemRef?.(answer.itemId, node)}
      tabIndex={-1}
      role="group"
      accessibilityLabel={answer.text}
    >
      <Card
        style={StyleSheet.flatten([
          answer.result === 'fail' || over ? styles.failed : undefined,
          pointedAt ? styles.pointed : undefined,
        ])}
      >
        <ItemHeading answer={answer} item={item} photos={photos} />
        {pointedAt ? (
          <Text color={colors.near} style={styles.pointedText}>
            To do: {pointedAt.message}
          </Text>
        ) : null}
        <ResultChoice answer={answer} onChoose={choose} />
        <ChecklistValue
          answer={answer}
          item={item}
          system={system}
          onAnswer={onAnswer}
          design={design}
          instruments={instruments}
          reading={reading}
          onDraft={onDraft}
          check={check}
        />
        {askReason ? (
          <OverLimitReason
            answer={answer}
            onAnswer={onAnswer}
            onPass={() => {
              onAnswer({ result: 'pass' });
              setReasonAsked(false);
            }}
            onFail={() => {
              onAnswer({ result: 'fail' });
              setNoteOpen(true);
              setReasonAsked(false);
            }}
          />
        ) : null}
        {Thumb && taken.length > 0 ? (
          <View style={styles.thumbs} role="list" accessibilityLabel={`Photos for ${answer.text}`}>
            {taken.map((p, n) => (
              <View key={p.id} role="listitem">
                <Thumb photo={p} size={72} label={`Photo ${n + 1} for ${answer.text}`} />
              </View>
            ))}
          </View>
        ) : null}
        {onPhoto && (item?.photoRequired || answer.result === 'fail') ? (
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
            <Text color={colors.accent}>+ Add a note</Text>
          </Pressable>
        )}
      </Card>
    </View>
  );
}

/** The item, its guidance, and what it requires (with the photos taken so far). */
function ItemHeading({ answer, item, photos }: { answer: Answer; item: Item | undefined; photos: number }) {
  return (
    <>
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
    </>
  );
}

/** Pass, fail or not applicable, as one radio group; choosing the selected answer again clears it. */
function ResultChoice({ answer, onChoose }: { answer: Answer; onChoose: (r: CheckResult) => void }) {
  return (
    <View style={styles.results} role="radiogroup" accessibilityLabel={`Result for ${answer.text}`}>
      {(['pass', 'fail', 'na'] as const).map((r) => {
        const selected = answer.result === r;
        return (
          <Pressable
            key={r}
            role="radio"
            aria-checked={selected}
            accessibilityLabel={`${checkResultLabel[r]}: ${answer.text}`}
            onPress={() => onChoose(r)}
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
  );
}

/** A value over its limit marked Pass: the inspector gives the reason, or marks the item Fail. */
function OverLimitReason({
  answer,
  onAnswer,
  onPass,
  onFail,
}: {
  answer: Answer;
  onAnswer: (patch: Partial<Answer>) => void;
  onPass: () => void;
  onFail: () => void;
}) {
  return (
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
        error={answer.result === 'pass' && !answer.overLimitReason?.trim() ? 'A reason is needed' : undefined}
      />
      <View style={styles.reasonActions}>
        <Button
          label="Pass with this reason"
          tone="quiet"
          disabled={!answer.overLimitReason?.trim()}
          onPress={onPass}
        />
        <Button label="Mark Fail" tone="accent" onPress={onFail} />
      </View>
    </View>
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
  addNote: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
  pointed: { borderColor: colors.near, borderWidth: 3 },
  pointedText: { fontFamily: fonts.semibold },
  thumbs: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
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
