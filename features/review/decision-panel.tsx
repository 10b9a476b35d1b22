import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { Pressable, StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import { FormAlert, type FormProblem } from '@/components/form-alert';
import { QueryState } from '@/components/query-state';
import { type RideStatus, RideStatusMark, rideStatusLabel } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import type { NoticeListItem } from '@/features/notices/schema';
import { applyServerError, fieldsOf } from '@/components/form/server-errors';
import { formatDateTime } from '@/lib/dates';
import {
  type ListedFinding,
  type ReviewState,
  useCachedReview,
  useCreateFinding,
  useDecide,
  useDeleteFinding,
  useFindings,
  useUpdateFinding,
} from '@/features/review/decision-api';
import { FindingForm, type FindingValues, type InspectionPhoto } from '@/features/review/finding-form';
import { FindingsList } from '@/features/review/findings-list';
import { useRideNotices } from '@/features/notices/ride-notices-api';
import { IssuedNoticeRow, NoticeRow, noticeHref } from '@/features/notices/ride-notices';
import { RideStatusControl } from '@/features/review/ride-status-control';
import { type DecisionInput, decisionInputSchema, severityInfo } from '@/features/review/schema';
import { useRideQuery } from '@/features/rides/api';

type Props = {
  inspectionId: string;
  rideId: string;
  rideName: string;
  rideStatus: 'in_service' | 'restricted' | 'out_of_service';
  rideStatusReason: string | null;
  reviewState: 'submitted' | 'approved' | 'returned';
  reviewNote: string | null;
  photos: { sha256: string; caption: string }[];
  /** The server's checked values against their limits (the analysis envelope), for the approve warning. */
  envelope?: readonly { id: string; label: string; status: 'within' | 'near' | 'over' }[];
};

type Editor = { mode: 'new' } | { mode: 'edit'; finding: ListedFinding } | null;

type IssuedNotice = { id: string; reference: string };

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

// ——— the review state ———

const stateWords: Record<ReviewState, { title: string; glyph: string }> = {
  submitted: { title: 'Waiting for a decision', glyph: '◷' },
  approved: { title: 'Approved', glyph: '✓' },
  returned: { title: 'Returned to the inspector', glyph: '↩' },
};

function ReviewStateView({ inspectionId, reviewState, reviewNote, saving }: Props & { saving: boolean }) {
  const cached = useCachedReview(inspectionId);
  const who = cached?.reviewedByName;
  const when = cached?.reviewedAt;
  const words = stateWords[reviewState];
  const by =
    reviewState !== 'submitted' && (who || when)
      ? [who ? `by ${who}` : null, when ? formatDateTime(when) : null].filter(Boolean).join(', ')
      : null;
  return (
    <View
      style={StyleSheet.flatten([styles.state, reviewState === 'approved' && styles.stateApproved])}
      accessibilityLabel={`Review: ${words.title}`}
    >
      <Text variant="heading">
        {words.glyph} {words.title}
        {by ? ` ${by}` : ''}
      </Text>
      {saving ? (
        <Text variant="small" color={colors.focus} accessibilityLiveRegion="polite">
          Saving the decision…
        </Text>
      ) : null}
      {reviewState === 'submitted' ? (
        <Text variant="small" muted>
          Record the findings, then approve the inspection or return it to the inspector.
        </Text>
      ) : null}
      {reviewNote ? (
        <Text>
          <Text variant="label" muted>
            {reviewState === 'returned'
              ? 'COMMENT FOR THE INSPECTOR '
              : reviewState === 'submitted'
                ? 'EARLIER COMMENT '
                : 'NOTE '}
          </Text>
          {reviewNote}
        </Text>
      ) : null}
      {reviewState === 'returned' ? (
        <Text variant="small" muted>
          The inspector sees this comment on the phone after the next sync, corrects the inspection and
          submits it again.
        </Text>
      ) : null}
      {reviewState === 'approved' ? (
        <Text variant="small" muted>
          The decision is final. The findings below say where each one stands now: the operator reports
          corrective actions on the notice, where they are verified and closed.
        </Text>
      ) : null}
    </View>
  );
}

// ——— the notice the approval issued ———

function InspectionNotices({
  rideId,
  query,
  notices,
  issued,
  findingsCount,
}: {
  rideId: string;
  query: ReturnType<typeof useRideNotices>;
  notices: NoticeListItem[];
  issued: IssuedNotice | null;
  findingsCount: number | null;
}) {
  // The operator's name for a notice the list does not hold yet; the inspection screen keeps the ride.
  const ride = useRideQuery(rideId);
  const operatorName = ride.data?.ride.operatorName ?? 'the ride’s operator';
  const headline = (reference: string, operator: string) => `Notice ${reference} issued to ${operator}`;
  const listed = issued ? notices.some((n) => n.id === issued.id) : true;
  return (
    <View style={styles.section}>
      {notices.map((n) => (
        <NoticeRow
          key={n.id}
          notice={n}
          headline={n.kind === 'inspection' ? headline(n.reference, n.operatorName) : undefined}
        />
      ))}
      {issued && !listed ? (
        <IssuedNoticeRow id={issued.id} headline={headline(issued.reference, operatorName)} />
      ) : null}
      {notices.length === 0 && !issued ? (
        query.isPending && query.fetchStatus !== 'idle' ? (
          <Text muted>Looking for the notice…</Text>
        ) : query.error ? (
          <View style={styles.problem} role="alert">
            <Text>
              {query.error instanceof OfflineError
                ? 'No connection to the server, so the notices could not be loaded.'
                : 'The notices could not be loaded.'}
            </Text>
            <Button label="Try again" tone="quiet" onPress={() => void query.refetch()} />
          </View>
        ) : (
          <Text muted>
            {findingsCount === 0
              ? 'No notice was issued: the inspection was approved without findings, so there is nothing new to tell the operator.'
              : 'No notice has been issued for this inspection.'}
          </Text>
        )
      ) : null}
    </View>
  );
}

// ——— findings ———

const CONFLICT =
  'Someone else changed this finding while you were editing it, so your change was not saved. The list now shows their version: cancel, then open the finding again to edit it from there.';

function problemText(err: unknown): string {
  if (err instanceof OfflineError) return 'No connection to the server; nothing was changed.';
  if (err instanceof ApiRequestError) return err.message;
  return 'Something went wrong; nothing was changed.';
}

function FindingsSection({
  inspectionId,
  rideId,
  findings,
  photos,
  editable,
  actionHref,
}: {
  inspectionId: string;
  rideId: string;
  findings: ListedFinding[];
  photos: readonly InspectionPhoto[];
  editable: boolean;
  actionHref: string | null;
}) {
  const create = useCreateFinding(inspectionId, rideId);
  const update = useUpdateFinding(inspectionId);
  const remove = useDeleteFinding(inspectionId);
  const [editor, setEditor] = useState<Editor>(null);
  const [problem, setProblem] = useState<string | null>(null);

  const addNew = async (values: FindingValues) => {
    await create.mutateAsync(values);
    setEditor(null);
  };
  const saveEdit = (finding: ListedFinding) => async (values: FindingValues) => {
    try {
      await update.mutateAsync({ finding, patch: values });
      setEditor(null);
    } catch (err) {
      if (err instanceof ApiRequestError && err.status === 409)
        throw new ApiRequestError(409, err.code, CONFLICT, err.issues);
      throw err;
    }
  };

  const editing = editable && editor?.mode === 'edit' ? editor.finding : null;
  return (
    <View style={styles.section}>
      {problem ? (
        <View style={styles.problem} role="alert">
          <Text color={colors.danger}>{problem}</Text>
          <Button label="Dismiss" tone="quiet" onPress={() => setProblem(null)} />
        </View>
      ) : null}
      <FindingsList
        findings={findings}
        photos={photos}
        editable={editable}
        actionHref={actionHref}
        editingId={editing?.id ?? null}
        editor={
          editing ? (
            <FindingForm
              finding={editing}
              photos={photos}
              onSubmit={saveEdit(editing)}
              onCancel={() => setEditor(null)}
            />
          ) : null
        }
        onEdit={(finding) => {
          setProblem(null);
          setEditor({ mode: 'edit', finding });
        }}
        onDelete={(finding) => {
          setProblem(null);
          if (editor?.mode === 'edit' && editor.finding.id === finding.id) setEditor(null);
          remove.mutate(finding, {
            onError: (err) => setProblem(`Finding ${finding.number} was not deleted. ${problemText(err)}`),
          });
        }}
      />
      {editable && editor?.mode === 'new' ? (
        <View style={styles.newForm}>
          <FindingForm photos={photos} onSubmit={addNew} onCancel={() => setEditor(null)} />
        </View>
      ) : null}
      {editable && editor === null ? (
        <Button
          label="Add finding"
          tone="quiet"
          onPress={() => {
            setProblem(null);
            setEditor({ mode: 'new' });
          }}
        />
      ) : null}
    </View>
  );
}

// ——— approve or return ———

type DecisionValues = z.output<typeof decisionInputSchema>;

/** The ride's status sent with the decision: kept as it is, or made stricter by this decision. */
type StatusChoice = 'keep' | 'out_of_service' | 'restricted';

/**
 * What stands against approving while the ride would run: findings that forbid operation need it out of
 * service, values over their limits at least restricted (the server refuses otherwise); values near their
 * limits are worth a second look but may be approved.
 */
export function approvalConcerns<E extends { label: string; status: 'within' | 'near' | 'over' }>(
  findings: readonly Pick<ListedFinding, 'number' | 'severity' | 'state'>[],
  envelope: readonly E[],
) {
  return {
    blocking: findings.filter((f) => f.state !== 'closed' && !severityInfo[f.severity].mayOperate),
    over: envelope.filter((e) => e.status === 'over'),
    near: envelope.filter((e) => e.status === 'near'),
  };
}

function DecisionForm({
  decide,
  problem,
  setProblem,
  note,
  onNoteChange,
  rideName,
  rideStatus,
  findings,
  envelope,
}: {
  decide: ReturnType<typeof useDecide>;
  problem: FormProblem | null;
  setProblem: (problem: FormProblem | null) => void;
  note: string;
  onNoteChange: (note: string) => void;
  rideName: string;
  rideStatus: RideStatus;
  findings: readonly ListedFinding[];
  envelope: readonly { id: string; label: string; status: 'within' | 'near' | 'over' }[];
}) {
  const [warning, setWarning] = useState<'hard' | 'soft' | null>(null);
  const [choice, setChoice] = useState<StatusChoice>('keep');
  const [reason, setReason] = useState('');
  const [reasonError, setReasonError] = useState<string | undefined>();
  const { control, handleSubmit, setValue, setError, clearErrors } = useForm<
    DecisionInput,
    unknown,
    DecisionValues
  >({ resolver: zodResolver(decisionInputSchema), defaultValues: { decision: 'approve', note } });

  const concerns = approvalConcerns(findings, envelope);
  const after: RideStatus = choice === 'keep' ? rideStatus : choice;
  // The stricter statuses this decision may set; easing a stop is the follow-up's or an override's.
  const stricter = (['restricted', 'out_of_service'] as const).filter(
    (s) => s !== rideStatus && !(rideStatus === 'out_of_service' && s === 'restricted'),
  );

  const send = handleSubmit(async (values) => {
    setProblem(null);
    const body: DecisionInput = {
      decision: values.decision,
      ...(values.note ? { note: values.note } : {}),
      ...(choice !== 'keep' ? { rideStatus: { status: choice, reason: reason.trim() } } : {}),
    };
    try {
      await decide.mutateAsync(body);
      onNoteChange('');
    } catch (err) {
      const p = applyServerError(err, setError, fieldsOf(['note']));
      setProblem(
        err instanceof ApiRequestError && err.status === 409
          ? {
              ...p,
              message: `${p.message} The inspection has been reloaded to show the decision that stands.`,
            }
          : p,
      );
    }
  });

  const reasonOk = () => {
    if (choice !== 'keep' && reason.trim() === '') {
      setReasonError('Say why; the operator reads it with the status.');
      return false;
    }
    return true;
  };

  const approve = (confirmed: boolean) => {
    clearErrors();
    setValue('decision', 'approve');
    const hard =
      (concerns.blocking.length > 0 && after !== 'out_of_service') ||
      (concerns.over.length > 0 && after === 'in_service');
    if (hard) {
      setWarning('hard');
      return;
    }
    if (concerns.near.length > 0 && after === 'in_service' && !confirmed) {
      setWarning('soft');
      return;
    }
    if (!reasonOk()) return;
    setWarning(null);
    void send();
  };
  const giveBack = () => {
    clearErrors();
    setWarning(null);
    setValue('decision', 'return');
    if (!reasonOk()) return;
    void send();
  };

  const listed = [
    ...concerns.blocking.map((f) => `Finding ${f.number} (${severityInfo[f.severity].label.toLowerCase()})`),
    ...concerns.over.map((e) => `${e.label}: over its limit`),
    ...(warning === 'soft' ? concerns.near.map((e) => `${e.label}: near its limit`) : []),
  ];

  return (
    <View style={styles.section}>
      <Controller
        control={control}
        name="note"
        render={({ field, fieldState }) => (
          <TextField
            ref={field.ref}
            label="Comment"
            hint="Needed to return the inspection: tell the inspector what to correct. Optional when approving; it is kept with the approval."
            value={field.value ?? ''}
            onChangeText={(t) => {
              field.onChange(t);
              onNoteChange(t);
            }}
            onBlur={field.onBlur}
            error={fieldState.error?.message}
            multiline
            numberOfLines={3}
            style={styles.note}
          />
        )}
      />
      <View style={styles.section}>
        <Text variant="label" muted>
          RIDE STATUS WITH THIS DECISION
        </Text>
        <View role="radiogroup" accessibilityLabel="Ride status with this decision" style={styles.buttons}>
          {(['keep', ...stricter] as StatusChoice[]).map((c) => {
            const on = c === choice;
            const label =
              c === 'keep'
                ? `Keep ${rideStatusLabel(rideStatus).toLowerCase()}`
                : `Set ${rideStatusLabel(c).toLowerCase()}`;
            return (
              <Pressable
                key={c}
                role="radio"
                aria-checked={on}
                accessibilityState={{ checked: on }}
                accessibilityLabel={label}
                onPress={() => {
                  setChoice(c);
                  setWarning(null);
                  setReasonError(undefined);
                }}
                style={StyleSheet.flatten([styles.choice, on && styles.choiceOn])}
              >
                <Text variant="label" color={on ? colors.base : colors.textMuted}>
                  {on ? '●' : '○'}
                </Text>
                {c === 'keep' ? <Text>{label}</Text> : <RideStatusMark status={c} compact />}
              </Pressable>
            );
          })}
        </View>
        {choice !== 'keep' ? (
          <TextField
            label="Reason for the status"
            hint="The operator reads it on the decision’s notice, with the findings and values behind it."
            value={reason}
            onChangeText={(t) => {
              setReason(t);
              setReasonError(undefined);
            }}
            error={reasonError}
            multiline
          />
        ) : (
          <Text variant="small" muted>
            One decision, one notice: a status set here goes on the approval’s notice to the operator.
            {rideStatus !== 'in_service'
              ? ' Approving a follow-up inspection returns the ride to service when nothing forbids operation.'
              : ''}
          </Text>
        )}
      </View>
      {warning ? (
        <View style={styles.warning} role="alert">
          <Text variant="heading">
            {warning === 'hard' ? '▲ Stop the ride with this approval' : '▲ Values near their limits'}
          </Text>
          <Text>
            {listed.join(', ')}.{' '}
            {warning === 'hard'
              ? `${rideName} must not carry riders on this result, but it would stay ${rideStatusLabel(after).toLowerCase()}. Set it out of service with this decision, or return the inspection if the values are wrong.`
              : `${rideName} would stay ${rideStatusLabel(after).toLowerCase()}.`}
          </Text>
          <View style={styles.buttons}>
            <Button
              label="Set out of service with this decision"
              tone="accent"
              onPress={() => {
                setWarning(null);
                setChoice('out_of_service');
              }}
            />
            {warning === 'soft' ? (
              <Button label="Approve anyway" tone="quiet" onPress={() => approve(true)} />
            ) : null}
          </View>
        </View>
      ) : null}
      <FormAlert problem={problem} />
      <View style={styles.buttons}>
        <Button
          label="Approve inspection"
          tone="accent"
          busy={decide.isPending && decide.variables?.decision === 'approve'}
          disabled={decide.isPending}
          onPress={() => approve(false)}
        />
        <Button
          label="Return to inspector"
          tone="quiet"
          busy={decide.isPending && decide.variables?.decision === 'return'}
          disabled={decide.isPending}
          onPress={giveBack}
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  panel: { gap: space.md },
  section: { gap: space.md },
  state: {
    gap: space.xs,
    paddingLeft: space.md,
    borderLeftWidth: 4,
    borderLeftColor: colors.border,
  },
  stateApproved: { borderLeftColor: colors.within },
  problem: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.sm,
    backgroundColor: colors.overSoft,
  },
  newForm: {
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.base,
  },
  warning: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.sm,
    borderLeftWidth: 4,
    borderLeftColor: colors.near,
    backgroundColor: colors.nearSoft,
  },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  choice: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  choiceOn: { borderColor: colors.base, borderWidth: 2.5 },
  note: { minHeight: 72, textAlignVertical: 'top' },
});
