import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { QueryState } from '@/components/query-state';
import { Text } from '@/components/text';
import { space } from '@/components/theme';
import { noticeHref, useRideNotices } from '@/features/notices';
import { useDecide, useFindings } from '@/features/review/decision-api';
import { DecisionForm, type KeyIntent } from '@/features/review/decision-panel/decision-form';
import { FindingsSection } from '@/features/review/decision-panel/findings-section';
import type { InspectionPhoto } from '@/features/review/finding-form';
import { InspectionNotices } from '@/features/review/decision-panel/inspection-notices';
import { ReviewStateView } from '@/features/review/decision-panel/review-state';
import { RideStatusControl } from '@/features/review/ride-status-control';

type Props = {
  inspectionId: string;
  rideId: string;
  rideName: string;
  rideStatus: 'in_service' | 'restricted' | 'out_of_service';
  rideStatusReason: string | null;
  reviewState: 'submitted' | 'approved' | 'returned';
  reviewNote: string | null;
  photos: readonly InspectionPhoto[];
  /** The server's checked values against their limits (the analysis envelope), for the approve warning. */
  envelope?: readonly { id: string; label: string; status: 'within' | 'near' | 'over' }[];
  /** Why this person may not approve it (their own inspection), from the server; null or absent: they may. */
  approvalRefusal?: string | null;
  /** A decision started from the keyboard (`features/review/shortcuts.ts`): brings the form forward. */
  keyIntent?: KeyIntent | null;
};

/**
 * What the supervisor decides about one inspection: its findings, approval or return to the inspector,
 * and the ride's status. Every change is saved at once through the API, which records it in the audit
 * trail; once the inspection is approved the decision and the findings are shown read-only, with the
 * notice the approval issued to the operator and where each finding stands in the corrective-action loop.
 */
export function DecisionPanel(props: Props) {
  const { inspectionId, rideId, rideName, rideStatus, rideStatusReason, reviewState, photos } = props;
  const findings = useFindings(inspectionId);
  const editable = reviewState !== 'approved';
  // Kept here, not in the form: the decision shows at once (optimistic), which unmounts the form, and a
  // refusal brings it back; the comment typed and the server's answer must survive both.
  const decide = useDecide(inspectionId, rideId);
  const [decisionProblem, setDecisionProblem] = useState<FormProblem | null>(null);
  const [noteDraft, setNoteDraft] = useState('');
  const approved = reviewState === 'approved';
  // The ride's notices, once there can be one for this inspection (the list has no inspection filter).
  const rideNotices = useRideNotices(rideId, approved);
  const ownNotices = (rideNotices.data?.notices ?? []).filter((n) => n.inspectionId === inspectionId);
  // The notice the approval made here answered with (the list may not hold it yet).
  const issued = decide.data?.reviewState === 'approved' ? (decide.data.notice ?? null) : null;
  const inspectionNoticeId = ownNotices.find((n) => n.kind === 'inspection')?.id ?? issued?.id ?? null;
  return (
    <View style={styles.panel} accessibilityLabel="Decision panel">
      <Card>
        <SectionHeading>Review</SectionHeading>
        <ReviewStateView {...props} saving={decide.isPending} />
        {reviewState !== 'submitted' ? <FormAlert problem={decisionProblem} /> : null}
      </Card>
      {approved ? (
        <Card accessibilityLabel="Notices of this inspection">
          <SectionHeading>Notice to the operator</SectionHeading>
          <InspectionNotices
            rideId={rideId}
            query={rideNotices}
            notices={ownNotices}
            issued={issued}
            findingsCount={findings.data?.findings.length ?? null}
          />
        </Card>
      ) : null}
      <Card>
        <SectionHeading>
          {`Findings${findings.data ? ` (${findings.data.findings.length})` : ''}`}
        </SectionHeading>
        <QueryState query={findings}>
          {(data) => (
            <FindingsSection
              inspectionId={inspectionId}
              rideId={rideId}
              findings={data.findings}
              photos={photos}
              editable={editable}
              actionHref={inspectionNoticeId ? noticeHref(inspectionNoticeId) : null}
            />
          )}
        </QueryState>
      </Card>
      {reviewState === 'submitted' ? (
        <Card>
          <SectionHeading>Decision</SectionHeading>
          <DecisionForm
            decide={decide}
            problem={decisionProblem}
            setProblem={setDecisionProblem}
            note={noteDraft}
            onNoteChange={setNoteDraft}
            rideName={rideName}
            rideStatus={rideStatus}
            findings={findings.data?.findings ?? []}
            envelope={props.envelope ?? []}
            approvalRefusal={props.approvalRefusal ?? null}
            keyIntent={props.keyIntent ?? null}
          />
        </Card>
      ) : null}
      <Card>
        <SectionHeading>Ride status</SectionHeading>
        <RideStatusControl
          key={rideStatus}
          rideId={rideId}
          inspectionId={inspectionId}
          rideName={rideName}
          status={rideStatus}
          statusReason={rideStatusReason}
        />
      </Card>
    </View>
  );
}

function SectionHeading({ children }: { children: string }) {
  return (
    <Text variant="label" muted role="heading" aria-level={2}>
      {children.toUpperCase()}
    </Text>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.md },
});
