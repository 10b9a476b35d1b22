import { type Href, Link } from 'expo-router';
import type { ReactNode } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Card } from '@/components/card';
import { Caution } from '@/components/caution';
import { EnvelopeMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import type { DesignData, FatigueDetailKind } from '@/features/loads/design-schema';
import { useRideLifeQuery } from '@/features/pivot-life/api';
import {
  FATIGUE_KIND_WORDS,
  LIFE_ASSUMPTIONS,
  LIFE_STANDARDS,
  LOAD_CASE_WORDS,
  basisText,
  cyclesText,
  lifeStatus,
  lifeUsedText,
  logText,
  projectedText,
  smallNumberText,
} from '@/features/pivot-life/life-words';
import { NdtRows } from '@/features/pivot-life/ndt-rows';
import { PinCheckRows } from '@/features/pivot-life/pin-check-rows';
import type { DetailLife, PivotLife, RideLife } from '@/features/pivot-life/schema';
import { WearRows } from '@/features/pivot-life/wear-rows';
import { useUnitSystem } from '@/features/settings';
import { formatDate } from '@/lib/dates';
import { formatSignificant } from '@/lib/units';

/** A pivot's other rows (wear, pins, NDT), drawn by the parts that own them. */
export type PivotRows = (pivot: PivotLife, life: RideLife, compact: boolean) => ReactNode;

/**
 * The wear trends, the pin checks and the NDT due dates of one pivot. The pin's partial factors are named
 * from the design data when the reader may see it (staff); without it the standard's values are named.
 */
function OtherRows({ pivot, life, design }: { pivot: PivotLife; life: RideLife; design: DesignData | null }) {
  const [system] = useUnitSystem();
  const pinCheck = design?.pivots.find((p) => p.joint === pivot.joint)?.pinCheck ?? null;
  return (
    <>
      <WearRows trends={pivot.wear} system={system} />
      {pivot.pin ? <PinCheckRows pin={pivot.pin} pinCheck={pinCheck} system={system} /> : null}
      {pivot.ndt.length ? <NdtRows due={pivot.ndt} asOf={life.asOf} /> : null}
    </>
  );
}

const STATUS_FILL = { within: colors.within, near: colors.near, over: colors.over } as const;

/** The share of the limit used as a bar, with its number and status mark beside it (never colour alone). */
export function LifeBar({ lifeUsed }: { lifeUsed: number }) {
  const status = lifeStatus(lifeUsed);
  const width = `${Math.min(1, Math.max(0, lifeUsed)) * 100}%` as const;
  return (
    <View style={styles.barRow}>
      <View
        style={styles.barTrack}
        accessible
        role="progressbar"
        accessibilityValue={{ min: 0, max: 100, now: Math.round(Math.min(100, lifeUsed * 100)) }}
        accessibilityLabel={`Life used ${lifeUsedText(lifeUsed)}`}
      >
        <View style={[styles.barFill, { width, backgroundColor: STATUS_FILL[status] }]} />
      </View>
      <Text variant="figure" style={styles.barFigure}>
        {lifeUsedText(lifeUsed)}
      </Text>
      <EnvelopeMark status={status} compact />
    </View>
  );
}

function DetailRow({ detail, life, compact }: { detail: DetailLife; life: RideLife; compact: boolean }) {
  const kind = FATIGUE_KIND_WORDS[detail.kind as FatigueDetailKind] ?? detail.kind;
  return (
    <View style={styles.detail} accessibilityLabel={`Fatigue detail ${detail.name}`}>
      <Text variant="heading">{detail.name}</Text>
      {compact ? null : (
        <Text variant="small" muted>
          {kind} · detail category {formatSignificant(detail.categoryMPa, 3)} MPa · damage limit{' '}
          {formatSignificant(detail.damageLimit, 3)}
        </Text>
      )}
      <LifeBar lifeUsed={detail.lifeUsed} />
      <Text variant="small">
        Projected limit: <Text variant="small">{projectedText(detail, life, formatDate)}</Text>
      </Text>
      {compact ? null : (
        <Text variant="small" muted>
          Damage {smallNumberText(detail.damage)} from {cyclesText(detail.cyclesLogged)} ride cycles ·{' '}
          {smallNumberText(detail.damagePerRideCycle)} per ride cycle
          {detail.governingCase ? ` · mostly from the ${LOAD_CASE_WORDS[detail.governingCase]}` : ''}
        </Text>
      )}
    </View>
  );
}

function PivotBlock({
  pivot,
  life,
  compact,
  rows,
  design,
}: {
  pivot: PivotLife;
  life: RideLife;
  compact: boolean;
  rows?: PivotRows;
  design: DesignData | null;
}) {
  return (
    <View style={styles.pivot} accessibilityLabel={`Pivot ${pivot.name}`}>
      <Text variant="label" color={colors.textMuted}>
        {pivot.name.toUpperCase()}
      </Text>
      {pivot.details.length === 0 ? (
        <Text variant="small" muted>
          No fatigue details at this pivot in the design data.
        </Text>
      ) : (
        pivot.details.map((d) => <DetailRow key={d.detail} detail={d} life={life} compact={compact} />)
      )}
      {rows ? rows(pivot, life, compact) : <OtherRows pivot={pivot} life={life} design={design} />}
    </View>
  );
}

/** What the projection takes for granted and which standards each part follows. */
export function LifeAssumptions() {
  return (
    <View style={styles.assumptions} accessibilityLabel="Assumptions">
      <Text variant="label" color={colors.textMuted}>
        ASSUMPTIONS
      </Text>
      {LIFE_ASSUMPTIONS.map((a) => (
        <Text key={a} variant="small" muted>
          • {a}
        </Text>
      ))}
      {Object.values(LIFE_STANDARDS).map((s) => (
        <Text key={s} variant="small" muted>
          {s}
        </Text>
      ))}
    </View>
  );
}

/** The life as loaded: per pivot its details (and the other parts' rows), the basis, the log, assumptions. */
export function PivotLifeBody({
  life,
  compact = false,
  rows,
  design = null,
}: {
  life: RideLife;
  compact?: boolean;
  rows?: PivotRows;
  design?: DesignData | null;
}) {
  return (
    <>
      <Text variant="small" muted>
        {basisText(life.basis, formatDate)} {logText(life, formatDate)}
      </Text>
      {life.pivots.length === 0 ? (
        <Text muted>The design data names no pivots.</Text>
      ) : (
        life.pivots.map((p) => (
          <PivotBlock key={p.joint} pivot={p} life={life} compact={compact} rows={rows} design={design} />
        ))
      )}
      {compact ? (
        <Text variant="small" muted>
          {LIFE_STANDARDS.fatigue}
        </Text>
      ) : (
        <LifeAssumptions />
      )}
      <Caution />
    </>
  );
}

type LinkSpec = { href: Href; label: string };

/**
 * A ride's pivot life as a card: per pivot, each fatigue detail's life used (a bar with its number and
 * mark), the projected date of its damage limit, then wear, pin and NDT rows; the basis, the running log's
 * coverage and rate, the assumptions and the caution. `compact` is the review desk's short form.
 */
export function PivotLifeSection({
  rideId,
  compact = false,
  rows,
  design = null,
  links = [],
}: {
  rideId: string;
  compact?: boolean;
  rows?: PivotRows;
  /** The design in force, when the reader may see it: it names the pin checks' partial factors. */
  design?: DesignData | null;
  links?: LinkSpec[];
}) {
  const query = useRideLifeQuery(rideId);
  return (
    <Card accessibilityLabel="Pivot life">
      <Text variant="heading">Pivot life</Text>
      {query.isPending ? (
        <Spinner color={colors.base} />
      ) : query.error || !query.data ? (
        <Text muted>The pivot life could not be loaded.</Text>
      ) : (
        <PivotLifeBody life={query.data} compact={compact} rows={rows} design={design} />
      )}
      {links.map((l) => (
        <Link key={l.label} href={l.href} asChild>
          <Pressable role="link" style={styles.link}>
            <Text variant="heading" color={colors.accent}>
              {l.label} ›
            </Text>
          </Pressable>
        </Link>
      ))}
    </Card>
  );
}

const styles = StyleSheet.create({
  pivot: {
    gap: space.sm,
    paddingTop: space.md,
    borderTopWidth: 1,
    borderTopColor: colors.surfaceSunk,
  },
  detail: { gap: 2 },
  barRow: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  barTrack: {
    flexGrow: 1,
    flexBasis: 120,
    maxWidth: 360,
    height: 12,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
    borderWidth: 1,
    borderColor: colors.border,
    overflow: 'hidden',
  },
  barFill: { height: '100%' },
  barFigure: { minWidth: 64 },
  assumptions: { gap: space.xs, paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.surfaceSunk },
  link: { minHeight: layout.touchTarget, justifyContent: 'center' },
});
