import { useLocalSearchParams, useRouter } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, View, useWindowDimensions } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Card } from '@/components/card';
import { QueryState } from '@/components/query-state';
import { SectionTitle } from '@/components/screen';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { RoleGate } from '@/features/auth/ui';
import { PivotLifeSection } from '@/features/pivot-life/ui';
import { useDesignVersionQuery, useRideQuery } from '@/features/registry/ui';
import { inspectionTypeLabel } from '@/features/registry/schema';
import { AnalysisFacts } from '@/features/review/analysis-facts';
import { LoadCheckBasis } from '@/features/records/ui';
import { ChecklistResults } from '@/features/review/checklist-results';
import { FatigueTable } from '@/features/review/fatigue-table';
import { CycleCharts } from '@/features/review/cycle-charts';
import { DecisionPanel, type KeyIntent } from '@/features/review/decision-panel';
import { reviewHref, reviewQueueHref } from '@/features/review/hrefs';
import { useInspectionReview } from '@/features/review/inspection-api';
import { ChainOrWhyNot } from '@/features/review/inspection-chain';
import { InspectionHeader, ReviewStateMark } from '@/features/review/inspection-header';
import type { InspectionDetail, InspectionPhoto } from '@/features/review/inspection-schema';
import { PhotoGallery, PhotoViewer } from '@/features/review/photo-gallery';
import { LimitsSection, ReadingsTable } from '@/features/review/readings-table';
import { MotionRecordSection } from '@/features/review/motion-record-section';
import { queueNeighbour } from '@/features/review/queue-order';
import { pivotName } from '@/features/review/review-format';
import { ShortcutHelp } from '@/features/review/shortcut-help';
import { useShortcuts } from '@/features/review/use-shortcuts';
import { TrailList } from '@/features/review/trail-list';
import { TrendsPanel } from '@/features/review/trends-panel';
import { useUnitSystem } from '@/features/settings';
import { ApiRequestError } from '@/lib/api-errors';
import { formatDateTime } from '@/lib/dates';

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

function InspectionReview({ id }: { id: string }) {
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
  const keys = useInspectionKeys(inspection);

  const data = design.data?.data ?? null;
  // Pivot names from the design version the inspection used; the engine's body names without one.
  const pivots = useMemo(
    () =>
      data
        ? data.bodies.map((b, i) => data.pivots.find((p) => p.joint === i)?.name ?? b.name)
        : (inspection.analysis?.joints.map((j) => j.name) ?? []),
    [data, inspection.analysis],
  );
  const photoContext = photoContextOf(inspection, pivots);

  const decision = <DecisionColumn inspection={inspection} ride={ride} keyIntent={keys.intent} />;

  const summary = (
    <>
      <InspectionHeader inspection={inspection} rideStatus={ride.data?.ride.status ?? null} />
      <Section title="Against the design limits">
        <LimitsSection inspection={inspection} pivots={pivots} system={system} />
      </Section>
      {inspection.analysis ? (
        <Section title="How the load check was made">
          <LoadCheckBasis {...inspection.analysis} system={system} />
        </Section>
      ) : null}
      {inspection.analysis?.fatigue?.length ? (
        <Section title="Fatigue of the pivots’ details">
          <FatigueTable fatigue={inspection.analysis.fatigue} pivots={pivots} system={system} />
        </Section>
      ) : null}
      {/* The ride's life as of today (the running log and its latest analysis), beside this inspection's own. */}
      <PivotLifeSection rideId={inspection.rideId} compact design={data} />
      <Section title="Readings">
        <ReadingsTable readings={withInstruments(inspection)} pivots={pivots} system={system} />
      </Section>
      {inspection.record.motionRecords?.length || inspection.analysis?.measuredRider?.length ? (
        <Section title="Recorded with the phone">
          <MotionRecordSection inspection={inspection} system={system} />
        </Section>
      ) : null}
    </>
  );

  const details = (
    <>
      <Section title="Body chain, to scale">
        <ChainOrWhyNot
          inspection={inspection}
          data={data}
          loading={design.isLoading}
          version={versionNumber}
          system={system}
        />
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
        <PhotoGallery
          photos={inspection.photos}
          onOpen={setOpenPhoto}
          context={photoContext}
          zone={inspection.siteTimeZone}
        />
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
      actions={<ShortcutHelp page="inspection" open={keys.helpOpen} onOpenChange={keys.setHelpOpen} />}
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
        zone={inspection.siteTimeZone}
      />
    </SubScreen>
  );
}

/**
 * The inspection's keys: j / k to the next or previous inspection of the queue page it was opened from,
 * a / r to start an approval or a return (the decision panel still asks for its button and its checks),
 * ? for the list. A decided inspection leaves a and r to the browser.
 */
function useInspectionKeys(inspection: InspectionDetail) {
  const router = useRouter();
  const [helpOpen, setHelpOpen] = useState(false);
  const [intent, setIntent] = useState<KeyIntent | null>(null);
  const go = (step: 1 | -1) => {
    const to = queueNeighbour(inspection.id, step);
    if (to) router.push(reviewHref(to));
  };
  const start = (kind: KeyIntent['kind']) => () => setIntent((was) => ({ kind, seq: (was?.seq ?? 0) + 1 }));
  const open = inspection.reviewState === 'submitted';
  useShortcuts(
    'inspection',
    helpOpen
      ? { help: () => setHelpOpen(false) }
      : {
          next: () => go(1),
          previous: () => go(-1),
          approve: open ? start('approve') : undefined,
          return: open ? start('return') : undefined,
          help: () => setHelpOpen(true),
        },
  );
  return { intent, helpOpen, setHelpOpen };
}

/** What a photo shows, in words: its pivot and the checklist item it was taken for. */
const photoContextOf =
  (inspection: InspectionDetail, pivots: string[]) =>
  (p: InspectionPhoto): string | null => {
    const item = p.checklistItemId
      ? inspection.record.checklist.find((a) => a.itemId === p.checklistItemId)
      : undefined;
    return (
      [p.joint !== null ? pivotName(p.joint, pivots) : null, item ? `Checklist: ${item.text}` : null]
        .filter(Boolean)
        .join(' · ') || null
    );
  };

/** The decision panel, once the ride (its status now) is loaded. */
function DecisionColumn({
  inspection,
  ride,
  keyIntent,
}: {
  inspection: InspectionDetail;
  ride: ReturnType<typeof useRideQuery>;
  keyIntent: KeyIntent | null;
}) {
  return ride.data ? (
    <DecisionPanel
      inspectionId={inspection.id}
      rideId={inspection.rideId}
      rideName={inspection.rideName}
      rideStatus={ride.data.ride.status}
      rideStatusReason={ride.data.ride.statusReason}
      reviewState={inspection.reviewState}
      reviewNote={inspection.reviewNote}
      photos={inspection.photos.map((p) => ({
        id: p.id,
        sha256: p.sha256,
        caption: p.caption,
        takenAt: p.takenAt,
        about: photoContextOf(inspection, [])(p),
      }))}
      envelope={inspection.analysis?.envelope}
      approvalRefusal={inspection.approvalRefusal}
      keyIntent={keyIntent}
    />
  ) : (
    <Card>
      {ride.error ? (
        <Text role="alert">The ride could not be loaded, so the decision cannot be made yet.</Text>
      ) : (
        <Spinner color={colors.base} />
      )}
    </Card>
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

/** The readings with the instrument each was taken with, which only the record itself holds. */
function withInstruments(i: InspectionDetail) {
  const instruments = new Map((i.record.readings ?? []).map((r) => [r.id, r.instrument]));
  return i.readings.map((r) => (instruments.has(r.id) ? { ...r, instrument: instruments.get(r.id) } : r));
}

const styles = StyleSheet.create({
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 1, minWidth: 0, gap: space.lg },
  side: { width: SIDE_WIDTH, gap: space.lg },
  stack: { gap: space.lg },
  section: { gap: space.sm },
});
