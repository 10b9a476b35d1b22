import Feather from '@expo/vector-icons/Feather';
import { Link, useLocalSearchParams } from 'expo-router';
import { useMemo, useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View, useWindowDimensions } from 'react-native';

import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SectionTitle } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { EnvelopeMark, RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { ApiRequestError } from '@/lib/api-errors';
import { RoleGate } from '@/features/auth';
import {
  useDesignVersionQuery,
  useRideQuery,
  ChainDrawing,
  type PivotPeak,
  designPose,
} from '@/features/registry';
import type { DesignData } from '@/features/loads/design-schema';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { formatDateTime } from '@/lib/dates';
import { AnalysisFacts } from '@/features/review/analysis-facts';
import { reviewHref, reviewQueueHref } from '@/features/review/hrefs';
import { rideHref } from '@/features/rides';
import { ChecklistResults } from '@/features/review/checklist-results';
import { CycleCharts } from '@/features/review/cycle-charts';
import { DecisionPanel } from '@/features/review/decision-panel';
import { useInspectionCycle, useInspectionReview } from '@/features/review/inspection-api';
import type { InspectionDetail, InspectionPhoto, ReviewState } from '@/features/review/inspection-schema';
import { PhotoGallery, PhotoViewer } from '@/features/review/photo-gallery';
import { LimitsSection, ReadingsTable } from '@/features/review/readings-table';
import { pivotName, reviewStateLabel } from '@/features/review/review-format';
import { TrailList } from '@/features/review/trail-list';
import { TrendsPanel } from '@/features/review/trends-panel';
import { useUnitSystem } from '@/features/settings';
import type { UnitSystem } from '@/lib/units';

/** Below this window width the decision panel follows the readings instead of standing beside them. */
const TWO_COLUMNS_FROM = 1280;
const SIDE_WIDTH = 380;

/** `/review/:id`: one inspection as a supervisor or admin reviews it. Inspectors keep their own screens. */
export function InspectionReviewScreen() {
  const { id } = useLocalSearchParams<{ id: string }>();
  const inspectionId = Array.isArray(id) ? (id[0] ?? '') : (id ?? '');
  return (
    <RoleGate roles={['supervisor', 'admin']}>
      {() => <InspectionReview key={inspectionId} id={inspectionId} />}
    </RoleGate>
  );
}

const back = { href: reviewQueueHref, label: 'Review queue' } as const;

export function InspectionReview({ id }: { id: string }) {
  const query = useInspectionReview(id);
  if (query.error instanceof ApiRequestError && query.error.status === 404) {
    return (
      <SubScreen title="Inspection not found" back={back}>
        <Card role="alert">
          <Text variant="heading">There is no inspection here.</Text>
          <Text muted>The link may be old, or the inspection has not reached the server yet.</Text>
        </Card>
      </SubScreen>
    );
  }
  return <QueryState query={query}>{({ inspection }) => <ReviewBody inspection={inspection} />}</QueryState>;
}

function ReviewBody({ inspection }: { inspection: InspectionDetail }) {
  const [system] = useUnitSystem();
  const { width } = useWindowDimensions();
  const twoColumns = width >= TWO_COLUMNS_FROM;
  const ride = useRideQuery(inspection.rideId);
  const versionNumber = inspection.analysis?.designVersion ?? inspection.designVersion ?? 0;
  const design = useDesignVersionQuery(inspection.rideId, versionNumber);
  const [openPhoto, setOpenPhoto] = useState<string | null>(null);

  const data = design.data?.data ?? null;
  // Pivot names from the design version the inspection used; the engine's body names without one.
  const pivots = useMemo(
    () =>
      data
        ? data.bodies.map((b, i) => data.pivots.find((p) => p.joint === i)?.name ?? b.name)
        : (inspection.analysis?.joints.map((j) => j.name) ?? []),
    [data, inspection.analysis],
  );
  const photoContext = (p: InspectionPhoto) => {
    const item = p.checklistItemId
      ? inspection.record.checklist.find((a) => a.itemId === p.checklistItemId)
      : undefined;
    return (
      [p.joint !== null ? pivotName(p.joint, pivots) : null, item ? `Checklist: ${item.text}` : null]
        .filter(Boolean)
        .join(' · ') || null
    );
  };

  const decision = ride.data ? (
    <DecisionPanel
      inspectionId={inspection.id}
      rideId={inspection.rideId}
      rideName={inspection.rideName}
      rideStatus={ride.data.ride.status}
      rideStatusReason={ride.data.ride.statusReason}
      reviewState={inspection.reviewState}
      reviewNote={inspection.reviewNote}
      photos={inspection.photos.map((p) => ({ sha256: p.sha256, caption: p.caption }))}
      envelope={inspection.analysis?.envelope}
    />
  ) : (
    <Card>
      {ride.error ? (
        <Text role="alert">The ride could not be loaded, so the decision cannot be made yet.</Text>
      ) : (
        <ActivityIndicator color={colors.base} />
      )}
    </Card>
  );

  const summary = (
    <>
      <Header inspection={inspection} rideStatus={ride.data?.ride.status ?? null} />
      <Section title="Against the design limits">
        <LimitsSection inspection={inspection} pivots={pivots} system={system} />
      </Section>
      <Section title="Readings">
        <ReadingsTable readings={withInstruments(inspection)} pivots={pivots} system={system} />
      </Section>
    </>
  );

  const details = (
    <>
      <Section title="Body chain, to scale">
        {data ? (
          <ChainSection
            inspection={inspection}
            data={data}
            system={system}
            version={versionNumber}
            hasAnalysis={inspection.analysis !== null}
          />
        ) : design.isLoading ? (
          <ActivityIndicator color={colors.base} />
        ) : (
          <Card>
            <Text muted>
              {versionNumber
                ? 'The design data of this inspection could not be loaded.'
                : 'This inspection has no design data, so there is no chain to draw.'}
            </Text>
          </Card>
        )}
      </Section>
      <Section title="Over the ride cycle">
        <CycleCharts inspectionId={inspection.id} pivots={pivots} system={system} />
      </Section>
      <Section title="Checklist">
        <ChecklistResults
          checklist={inspection.record.checklist}
          photos={inspection.photos}
          onOpenPhoto={setOpenPhoto}
          envelope={inspection.analysis?.envelope}
          readings={inspection.readings}
          template={{ id: inspection.templateId, version: inspection.templateVersion }}
          system={system}
        />
      </Section>
      <Section title={`Photos (${inspection.photos.length})`}>
        {inspection.photosMissing > 0 ? (
          <Text variant="small" muted>
            {inspection.photosMissing} of {inspection.photos.length} not uploaded from the phone yet.
          </Text>
        ) : null}
        <PhotoGallery photos={inspection.photos} onOpen={setOpenPhoto} context={photoContext} />
      </Section>
      {twoColumns ? null : (
        <Section title="What the analysis used">
          <AnalysisFacts inspection={inspection} />
        </Section>
      )}
      <Section title="Trends of this ride">
        <TrendsPanel rideId={inspection.rideId} currentId={inspection.id} system={system} />
      </Section>
      <Section title="History">
        <TrailList inspectionId={inspection.id} />
      </Section>
    </>
  );

  return (
    <SubScreen
      title={`${inspectionTypeLabel[inspection.type]} inspection`}
      subtitle={`${inspection.rideName} · submitted ${formatDateTime(inspection.submittedAt)}`}
      badge={<ReviewStateMark state={inspection.reviewState} />}
      back={back}
      wideContent
    >
      {twoColumns ? (
        <View style={styles.columns}>
          <View style={styles.main}>
            {summary}
            {details}
          </View>
          <View style={styles.side}>
            {decision}
            <AnalysisFacts inspection={inspection} />
          </View>
        </View>
      ) : (
        <View style={styles.stack}>
          {summary}
          <Section title="Decision">{decision}</Section>
          {details}
        </View>
      )}
      <PhotoViewer
        photos={inspection.photos}
        openId={openPhoto}
        onChange={setOpenPhoto}
        context={photoContext}
      />
    </SubScreen>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <View style={styles.section}>
      <SectionTitle>{title}</SectionTitle>
      {children}
    </View>
  );
}

/** Who, what, when and where it stands: the ride (with its status), the load check, the review. */
function Header({
  inspection: i,
  rideStatus,
}: {
  inspection: InspectionDetail;
  rideStatus: 'in_service' | 'restricted' | 'out_of_service' | null;
}) {
  return (
    <Card style={styles.header}>
      <View style={styles.headerTop}>
        <Link href={rideHref(i.rideId)} asChild>
          <Pressable role="link" accessibilityLabel={`Ride ${i.rideName}`} style={styles.rideLink}>
            <Text variant="title" color={colors.accent}>
              {i.rideName}
            </Text>
            <Feather name="chevron-right" size={22} color={colors.accent} />
          </Pressable>
        </Link>
        <View style={styles.marks}>
          {rideStatus ? <RideStatusMark status={rideStatus} /> : null}
          {i.analysisStatus ? (
            <EnvelopeMark status={i.analysisStatus} />
          ) : (
            <View style={styles.plainMark}>
              <Text variant="label" muted>
                {i.analysis ? 'No limits to check' : 'Not checked'}
              </Text>
            </View>
          )}
        </View>
      </View>
      <View style={styles.facts}>
        <Fact label="Type" value={inspectionTypeLabel[i.type]} />
        <Fact label="Inspector" value={i.inspectorName} />
        <Fact label="Submitted" value={formatDateTime(i.submittedAt)} />
        <Fact label="Received" value={formatDateTime(i.receivedAt)} />
        <Fact label="Review" value={reviewStateLabel[i.reviewState]} />
        <Fact
          label="Recorded"
          value={`${i.failedItems} failed · ${i.readingCount} readings · ${i.photoCount} photos`}
        />
      </View>
      {i.reviewedAt ? (
        <Text variant="small" muted>
          {reviewStateLabel[i.reviewState]} by {i.reviewedByName ?? 'someone'} on{' '}
          {formatDateTime(i.reviewedAt)}
          {i.reviewNote ? `: “${i.reviewNote}”` : ''}
        </Text>
      ) : null}
      {i.amendsId ? <InspectionLink id={i.amendsId} label="Corrects an earlier inspection" /> : null}
      {i.amendedBy.map((a) => (
        <InspectionLink
          key={a.id}
          id={a.id}
          label={`Corrected by a later inspection (${formatDateTime(a.submittedAt)})`}
        />
      ))}
      {i.record.declaration ? (
        <View style={styles.notes} accessibilityLabel="Declaration">
          <Text variant="label" muted>
            DECLARATION
          </Text>
          <Text>“{i.record.declaration.text}”</Text>
          <Text variant="small" muted>
            Made by {i.record.declaration.declaredByName} on {formatDateTime(i.record.declaration.declaredAt)}
          </Text>
        </View>
      ) : (
        <Text variant="small" muted>
          No declaration: recorded before inspectors were asked for one.
        </Text>
      )}
      {i.record.notes ? (
        <View style={styles.notes}>
          <Text variant="label" muted>
            INSPECTOR’S NOTES
          </Text>
          <Text>{i.record.notes}</Text>
        </View>
      ) : null}
    </Card>
  );
}

/** The readings with the instrument each was taken with, which only the record itself holds. */
function withInstruments(i: InspectionDetail) {
  const instruments = new Map((i.record.readings ?? []).map((r) => [r.id, r.instrument]));
  return i.readings.map((r) => (instruments.has(r.id) ? { ...r, instrument: instruments.get(r.id) } : r));
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <Text>{value}</Text>
    </View>
  );
}

function InspectionLink({ id, label }: { id: string; label: string }) {
  return (
    <Link href={reviewHref(id)} asChild>
      <Pressable role="link" style={styles.inlineLink}>
        <Feather name="git-commit" size={16} color={colors.accent} />
        <Text variant="heading" color={colors.accent}>
          {label}
        </Text>
      </Pressable>
    </Link>
  );
}

const reviewStateSpec: Record<
  ReviewState,
  { icon: 'clock' | 'check-circle' | 'corner-up-left'; fg: string; bg: string }
> = {
  submitted: { icon: 'clock', fg: colors.text, bg: colors.surfaceSunk },
  approved: { icon: 'check-circle', fg: colors.within, bg: colors.withinSoft },
  returned: { icon: 'corner-up-left', fg: colors.near, bg: colors.nearSoft },
};

/** The review state in words with its own icon; colour only repeats what they say. */
function ReviewStateMark({ state }: { state: ReviewState }) {
  const spec = reviewStateSpec[state];
  return (
    <View style={StyleSheet.flatten([styles.stateMark, { backgroundColor: spec.bg }])}>
      <Feather name={spec.icon} size={14} color={spec.fg} />
      <Text variant="label" color={spec.fg}>
        {reviewStateLabel[state]}
      </Text>
    </View>
  );
}

type Pose = 'design' | 'peak';

/**
 * The chain of the design version the inspection was checked against, with each pivot's peak force from
 * this inspection's load check; when the cycle is at hand, also at the instant the main pivot peaks.
 */
function ChainSection({
  inspection,
  data,
  system,
  version,
  hasAnalysis,
}: {
  inspection: InspectionDetail;
  data: DesignData;
  system: UnitSystem;
  version: number;
  hasAnalysis: boolean;
}) {
  const [pose, setPose] = useState<Pose>('design');
  const cycle = useInspectionCycle(inspection.id, hasAnalysis);
  const c = cycle.data;
  const angles = useMemo(() => {
    if (pose === 'peak' && c && c.joints.length > 0) {
      const k = c.joints[0].peakForce.index;
      return c.joints.map((j) => j.angleRad[k] ?? 0);
    }
    return designPose(data);
  }, [pose, c, data]);
  const peaks: PivotPeak[] | null = inspection.analysis
    ? inspection.analysis.joints.map((j, i) => ({
        joint: i,
        forceN: j.peakForceN,
        status: inspection.analysis?.envelope.find((e) => e.id === `joints.${i}.force`)?.status ?? null,
      }))
    : null;
  return (
    <Card style={styles.chain}>
      <View style={styles.chainHead}>
        <Text variant="small" muted style={styles.chainText}>
          Design data version {version}.{' '}
          {pose === 'design'
            ? 'At the design pose. Beside each pivot: its peak force in this inspection’s load check.'
            : 'At the instant the main pivot’s force peaks in this inspection’s ride cycle.'}
        </Text>
        {c ? (
          <Segmented
            label="Pose shown"
            value={pose}
            onChange={setPose}
            options={[
              { value: 'design', label: 'Design pose' },
              { value: 'peak', label: 'At peak load' },
            ]}
          />
        ) : null}
      </View>
      <ChainDrawing data={data} pose={angles} peaks={peaks} system={system} maxHeight={380} />
    </Card>
  );
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 1, minWidth: 0, gap: space.lg },
  side: { width: SIDE_WIDTH, gap: space.lg },
  stack: { gap: space.lg },
  section: { gap: space.sm },
  header: { gap: space.md },
  headerTop: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  rideLink: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    minHeight: layout.touchTarget,
    flexShrink: 1,
  },
  marks: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  plainMark: {
    paddingHorizontal: space.sm + 2,
    paddingVertical: space.xs,
    borderRadius: radius.sm,
    backgroundColor: colors.surfaceSunk,
  },
  facts: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.xl, rowGap: space.sm },
  fact: { gap: 2, minWidth: 140 },
  notes: { gap: 2 },
  inlineLink: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: layout.touchTarget },
  stateMark: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs + 2,
    paddingHorizontal: space.sm + 2,
    paddingVertical: space.xs,
    borderRadius: radius.sm,
  },
  chain: { gap: space.md },
  chainHead: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    justifyContent: 'space-between',
    gap: space.sm,
  },
  chainText: { flexShrink: 1, flexBasis: 260, flexGrow: 1 },
});
