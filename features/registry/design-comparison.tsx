import { useMemo, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Segmented } from '@/components/segmented';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import type { DesignData } from '@/features/loads/design-schema';
import {
  type DesignChange,
  type DesignSection,
  changeText,
  diffDesign,
  sectionLabel,
  summarise,
  summaryText,
} from '@/features/registry/design-diff';
import type { UnitSystem } from '@/lib/units';

/** The effect of a limit change as a word and an icon together, so colour is never the only signal. */
export function EffectBadge({ effect }: { effect: 'loosened' | 'tightened' }) {
  const loose = effect === 'loosened';
  return (
    <View style={[styles.badge, loose ? styles.badgeLoose : styles.badgeTight]}>
      <Feather name={loose ? 'unlock' : 'lock'} size={13} color={loose ? colors.over : colors.within} />
      <Text variant="label" color={loose ? colors.over : colors.within}>
        {loose ? 'LOOSENED' : 'TIGHTENED'}
      </Text>
    </View>
  );
}

/**
 * A design revision against the version in force, field by field with units, every loosened limit marked.
 * The list comes from features/registry/design-diff.ts, the same rule that makes the server hold a
 * loosening revision for a second person.
 */
export function DesignComparison({
  before,
  after,
  system,
  beforeLabel,
  afterLabel,
  narrow = false,
}: {
  before: DesignData | null;
  after: DesignData;
  system: UnitSystem;
  beforeLabel: string;
  afterLabel: string;
  /** In a side pane: each change's values under its name, as on a phone, not in columns. */
  narrow?: boolean;
}) {
  const wide = useWide() && !narrow;
  const changes = useMemo(() => diffDesign(before, after, system), [before, after, system]);
  const summary = summarise(changes);
  const [show, setShow] = useState<'all' | 'limits'>('all');
  const shown = show === 'limits' ? changes.filter((c) => c.limit) : changes;
  const sections = [...new Set(shown.map((c) => c.section))];
  if (!before)
    return (
      <Text muted>
        The ride has no design data in force yet: this becomes its first version, with every limit as given.
      </Text>
    );
  return (
    <View style={styles.box} accessibilityLabel={`Comparison of ${afterLabel} with ${beforeLabel}`}>
      <View style={styles.summary} role="status">
        <Feather
          name={summary.loosened ? 'alert-triangle' : 'check-circle'}
          size={18}
          color={summary.loosened ? colors.over : colors.within}
        />
        <Text variant="heading" style={styles.flex}>
          {summaryText(summary)}
        </Text>
      </View>
      {summary.loosened ? (
        <View style={styles.loosenedNote} role="alert">
          <Text color={colors.over}>
            {summary.loosened === 1 ? 'A limit is' : `${summary.loosened} limits are`} looser than in{' '}
            {beforeLabel}. A second person — another supervisor or an admin — must approve this version before
            it takes effect; until then {beforeLabel} stays in force for analyses and the phones.
          </Text>
        </View>
      ) : null}
      {changes.length > 0 ? (
        <Segmented
          label="Show"
          value={show}
          options={[
            { value: 'all', label: `Every change (${changes.length})` },
            { value: 'limits', label: `Limits (${changes.filter((c) => c.limit).length})` },
          ]}
          onChange={setShow}
        />
      ) : null}
      {wide && shown.length > 0 ? (
        <View style={[styles.row, styles.head]}>
          <Text variant="label" muted style={styles.whatCol}>
            FIELD
          </Text>
          <Text variant="label" muted style={styles.valueCol}>
            {beforeLabel.toUpperCase()}
          </Text>
          <Text variant="label" muted style={styles.arrow}>
            {' '}
          </Text>
          <Text variant="label" muted style={styles.valueCol}>
            {afterLabel.toUpperCase()}
          </Text>
          <View style={styles.effectCol} />
        </View>
      ) : null}
      {sections.map((section) => (
        <Section
          key={section}
          section={section}
          changes={shown.filter((c) => c.section === section)}
          wide={wide}
        />
      ))}
      {show === 'limits' && shown.length === 0 && changes.length > 0 ? (
        <Text muted>No limit changes: only design values.</Text>
      ) : null}
    </View>
  );
}

function Section({
  section,
  changes,
  wide,
}: {
  section: DesignSection;
  changes: DesignChange[];
  wide: boolean;
}) {
  return (
    <View style={styles.section}>
      <Text variant="label" muted role="heading" aria-level={3} style={styles.sectionLabel}>
        {sectionLabel[section].toUpperCase()}
      </Text>
      {changes.map((c, i) => (
        <ChangeRow key={`${c.where}|${c.field}|${i}`} change={c} wide={wide} />
      ))}
    </View>
  );
}

function ChangeRow({ change: c, wide }: { change: DesignChange; wide: boolean }) {
  const loose = c.effect === 'loosened';
  const what = c.where ? `${c.field} · ${c.where}` : c.field;
  const value = (v: string | null, side: 'before' | 'after') =>
    v ?? (side === 'before' ? 'not given' : c.limit ? 'removed: not checked' : 'removed');
  const effect = c.effect === 'changed' ? null : <EffectBadge effect={c.effect} />;
  return (
    <View
      style={[wide ? styles.row : styles.rowPhone, loose ? styles.rowLoose : null]}
      accessible
      accessibilityLabel={changeText(c)}
    >
      <Text variant={c.limit ? 'label' : 'small'} style={wide ? styles.whatCol : undefined}>
        {what}
      </Text>
      {wide ? (
        <>
          <Text variant="figure" muted={c.before === null} style={styles.valueCol}>
            {value(c.before, 'before')}
          </Text>
          <Feather name="arrow-right" size={16} color={colors.textMuted} style={styles.arrow} />
          <Text variant="figure" muted={c.after === null} style={styles.valueCol}>
            {value(c.after, 'after')}
          </Text>
          <View style={styles.effectCol}>{effect}</View>
        </>
      ) : (
        <View style={styles.phoneValues}>
          <Text variant="figure" muted={c.before === null}>
            {value(c.before, 'before')}
          </Text>
          <Feather name="arrow-right" size={14} color={colors.textMuted} />
          <Text variant="figure" muted={c.after === null}>
            {value(c.after, 'after')}
          </Text>
          {effect}
        </View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  flex: { flex: 1, minWidth: 0 },
  box: { gap: space.md },
  summary: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  loosenedNote: {
    backgroundColor: colors.overSoft,
    borderLeftWidth: 4,
    borderLeftColor: colors.over,
    borderRadius: radius.sm,
    padding: space.md,
  },
  section: {
    gap: 0,
    borderWidth: 1,
    borderColor: colors.border,
    borderRadius: radius.md,
    overflow: 'hidden',
    backgroundColor: colors.surface,
    paddingTop: space.sm,
  },
  sectionLabel: { paddingHorizontal: space.md },
  head: { borderTopWidth: 0, paddingVertical: 0 },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  rowPhone: {
    gap: space.xs,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  rowLoose: { backgroundColor: colors.overSoft },
  whatCol: { flex: 2, minWidth: 0 },
  valueCol: { flex: 1.2, minWidth: 0 },
  arrow: { width: 16 },
  effectCol: { width: 120, alignItems: 'flex-start' },
  phoneValues: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  badge: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: 4,
    paddingHorizontal: 6,
    paddingVertical: 2,
    borderRadius: radius.sm,
    borderWidth: 1,
  },
  badgeLoose: { backgroundColor: colors.surface, borderColor: colors.over },
  badgeTight: { backgroundColor: colors.withinSoft, borderColor: colors.within },
});
