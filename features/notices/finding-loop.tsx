import { sha256 } from '@noble/hashes/sha256';
import { bytesToHex } from '@noble/hashes/utils';
import { toByteArray } from 'base64-js';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import type { z } from 'zod';

import { Button } from '@/components/button';
import { FormAlert } from '@/components/form-alert';
import { LabelledLine } from '@/components/labelled-line';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import type { SessionUser } from '@/features/auth/schema';
import { capturePhoto } from '@/features/photos/photo-capture';
import { CorrectiveActionForm, problemText } from '@/features/notices/corrective-action-form';
import { NoticePhotos } from '@/features/notices/notice-photos';
import { isPastDue, noticeHref, todayIso } from '@/features/notices/notice-text';
import {
  putEvidencePhoto,
  SAVING_PREFIX,
  useCloseFinding,
  useReopenFinding,
} from '@/features/notices/notices-api';
import {
  type FindingStateResponse,
  type NoticeFinding,
  findingCloseInputSchema,
  findingReopenInputSchema,
} from '@/features/notices/schema';
import { formatDate, formatDateTime } from '@/lib/dates';
import { FindingStateMark } from '@/features/notices/finding-state-mark';
import { SeverityMark } from '@/features/notices/severity-mark';

/** Who may verify findings: the server's verifiers (supervisor, admin, inspector). */
export const isVerifier = (user: SessionUser) =>
  user.role === 'supervisor' || user.role === 'admin' || user.role === 'inspector';

type Panel = 'report' | 'close' | 'reopen' | null;

/**
 * One finding of a notice as it stands now, and what can be done about it: the operator reports
 * corrective action with a note and photos; the inspection body verifies and closes it (note and evidence
 * required), or reopens it with a comment. The ride's status after the change is shown here.
 */
export function FindingLoop({
  noticeId,
  finding,
  user,
}: {
  noticeId: string;
  finding: NoticeFinding;
  user: SessionUser;
}) {
  const [panel, setPanel] = useState<Panel>(null);
  const [outcome, setOutcome] = useState<FindingStateResponse | null>(null);
  const operator = user.role === 'operator';
  const verifier = isVerifier(user);
  const pastDue = isPastDue(finding, todayIso());
  const f = finding;
  const panelProps: PanelProps = {
    noticeId,
    finding: f,
    userName: user.name,
    onDone: (answer) => {
      setOutcome(answer);
      setPanel(null);
    },
    onCancel: () => setPanel(null),
  };

  return (
    <View style={styles.card} role="listitem" accessibilityLabel={`Finding ${f.number}`}>
      <View style={styles.head}>
        <Text variant="heading">Finding {f.number}</Text>
        <SeverityMark severity={f.severity} compact />
        <FindingStateMark state={f.state} />
      </View>
      <Text>{f.description}</Text>
      {f.requiredAction ? <LabelledLine label="Required action" value={f.requiredAction} /> : null}
      <LabelledLine
        label="Due"
        value={f.dueOn ? `${formatDate(f.dueOn)}${pastDue ? ' — past due' : ''}` : 'No due date'}
        color={pastDue ? colors.danger : undefined}
      />
      <StateStory finding={f} />

      <View style={styles.actions}>
        <Text variant="label" muted>
          CORRECTIVE ACTIONS ({f.correctiveActions.length})
        </Text>
        {f.correctiveActions.length === 0 ? (
          <Text variant="small" muted>
            {operator ? 'None reported yet.' : 'The operator has not reported any yet.'}
          </Text>
        ) : (
          f.correctiveActions.map((a, i) => {
            const saving = a.id.startsWith(SAVING_PREFIX);
            return (
              <View
                key={a.id}
                style={StyleSheet.flatten([styles.action, saving && styles.saving])}
                accessibilityLabel={`Corrective action ${i + 1}`}
              >
                <Text variant="small" muted>
                  {a.reportedByName ?? 'Someone of the operator'} · {formatDateTime(a.reportedAt)}
                  {saving ? ' · Sending…' : ''}
                </Text>
                <Text>{a.note}</Text>
                <NoticePhotos
                  photos={a.photoShas.map((sha, n) => ({ sha256: sha, caption: `Evidence photo ${n + 1}` }))}
                  label={`Evidence photos (${a.photoShas.length})`}
                />
              </View>
            );
          })
        )}
      </View>

      {outcome ? <Outcome outcome={outcome} /> : null}

      {operator && f.state !== 'closed' ? (
        panel === 'report' ? (
          <CorrectiveActionForm
            noticeId={noticeId}
            finding={f}
            userName={user.name}
            onDone={() => setPanel(null)}
            onCancel={() => setPanel(null)}
          />
        ) : (
          <Button
            label="Report corrective action"
            tone="accent"
            accessibilityLabel={`Report corrective action on finding ${f.number}`}
            onPress={() => setPanel('report')}
          />
        )
      ) : null}

      {verifier ? (
        panel === 'close' ? (
          <ClosePanel {...panelProps} />
        ) : panel === 'reopen' ? (
          <ReopenPanel {...panelProps} />
        ) : (
          <View style={styles.buttons}>
            {f.state !== 'closed' ? (
              <Button
                label="Verify and close"
                tone="primary"
                accessibilityLabel={`Verify and close finding ${f.number}`}
                onPress={() => {
                  setOutcome(null);
                  setPanel('close');
                }}
              />
            ) : null}
            {f.state !== 'open' ? (
              <Button
                label="Reopen"
                tone="danger"
                accessibilityLabel={`Reopen finding ${f.number}`}
                onPress={() => {
                  setOutcome(null);
                  setPanel('reopen');
                }}
              />
            ) : null}
          </View>
        )
      ) : null}
    </View>
  );
}

/** Who closed or reopened the finding, when, and with what comment. */
function StateStory({ finding: f }: { finding: NoticeFinding }) {
  if (f.state === 'closed')
    return (
      <View style={styles.story}>
        <Text variant="small">
          Verified and closed{f.closedByName ? ` by ${f.closedByName}` : ''}
          {f.closedAt ? `, ${formatDateTime(f.closedAt)}` : ''}.
        </Text>
        {f.stateNote ? <LabelledLine label="Verification note" value={f.stateNote} /> : null}
        {f.closeEvidence ? <LabelledLine label="Evidence" value={evidenceWords(f.closeEvidence)} /> : null}
        {f.closeEvidence && f.closeEvidence.photoShas.length > 0 ? (
          <NoticePhotos
            photos={f.closeEvidence.photoShas.map((sha, n) => ({
              sha256: sha,
              caption: `Verification photo ${n + 1}`,
            }))}
            label={`Verification photos (${f.closeEvidence.photoShas.length})`}
          />
        ) : null}
      </View>
    );
  if (!f.stateNote) return null;
  // An open finding with a comment was reopened; after a further action report the comment still stands.
  return (
    <View style={StyleSheet.flatten([styles.story, styles.reopened])}>
      <Text variant="small">
        {f.state === 'open' ? 'Reopened' : 'Reopened earlier'}
        {f.updatedByName && f.state === 'open' ? ` by ${f.updatedByName}` : ''}
        {f.state === 'open' ? `, ${formatDateTime(f.updatedAt)}` : ''}
      </Text>
      <LabelledLine label="Still to put right" value={f.stateNote} />
    </View>
  );
}

function evidenceWords(e: NonNullable<NoticeFinding['closeEvidence']>): string {
  return [
    e.reference,
    e.photoShas.length > 0 ? `${e.photoShas.length} photo${e.photoShas.length > 1 ? 's' : ''}` : null,
    e.correctiveActions > 0
      ? `the operator’s corrective-action report${e.correctiveActions > 1 ? 's' : ''} (${e.correctiveActions})`
      : null,
  ]
    .filter(Boolean)
    .join(' · ');
}

/** What followed a close or a reopen: the ride's status now and the status notice, when one was issued. */
function Outcome({ outcome }: { outcome: FindingStateResponse }) {
  return (
    <View style={styles.outcome} role="status" accessibilityLiveRegion="polite">
      <View style={styles.outcomeRow}>
        <Text variant="label" muted>
          {outcome.statusNotice ? 'THE RIDE’S STATUS FOLLOWED' : 'RIDE STATUS NOW'}
        </Text>
        <RideStatusMark status={outcome.ride.status} />
      </View>
      {outcome.ride.statusReason ? <Text variant="small">{outcome.ride.statusReason}</Text> : null}
      {outcome.statusNotice ? (
        <Link href={noticeHref(outcome.statusNotice.id)} asChild>
          <Pressable role="link" style={styles.link}>
            <Text variant="heading" color={colors.accent}>
              Status notice {outcome.statusNotice.reference} issued to the operator ›
            </Text>
          </Pressable>
        </Link>
      ) : null}
    </View>
  );
}

type PanelProps = {
  noticeId: string;
  finding: NoticeFinding;
  userName: string;
  onDone: (answer: FindingStateResponse) => void;
  onCancel: () => void;
};

/**
 * Closing takes the verifier's note and evidence (the status rules): a document reference typed here, or
 * the operator's corrective-action report already on the finding. Closing never returns the ride to
 * service; the last finding that forbids operation closed books the ride's follow-up inspection.
 */
function ClosePanel({ noticeId, finding, userName, onDone, onCancel }: PanelProps) {
  const change = useCloseFinding(noticeId, userName);
  const [note, setNote] = useState('');
  const [evidenceRef, setEvidenceRef] = useState('');
  const [errors, setErrors] = useState<{ note?: string; evidence?: string }>({});
  // Photos taken at the verification, uploaded under their SHA-256 as soon as they are picked.
  const [shots, setShots] = useState<{ sha256: string; state: 'uploading' | 'uploaded' | 'failed' }[]>([]);
  const reports = finding.correctiveActions.length;
  const uploaded = shots.filter((p) => p.state === 'uploaded').map((p) => p.sha256);
  const title = `Verify and close finding ${finding.number}`;
  const addPhoto = async (source: 'camera' | 'library') => {
    const shot = await capturePhoto(source).catch(() => null);
    if (!shot) return;
    const bytes = toByteArray(shot.base64);
    const hash = bytesToHex(sha256(bytes));
    if (shots.some((p) => p.sha256 === hash)) return;
    const mark = (state: 'uploaded' | 'failed') =>
      setShots((list) => list.map((p) => (p.sha256 === hash ? { ...p, state } : p)));
    setShots((list) => [...list, { sha256: hash, state: 'uploading' }]);
    setErrors((e) => ({ ...e, evidence: undefined }));
    await putEvidencePhoto({ sha256: hash, mime: shot.mime, bytes }).then(
      () => mark('uploaded'),
      () => mark('failed'),
    );
  };
  const submit = () => {
    if (shots.some((p) => p.state === 'uploading')) return;
    const checked = findingCloseInputSchema.safeParse({ note, evidenceRef, photoShas: uploaded });
    const noteError = checked.success
      ? undefined
      : checked.error.issues.find((i) => i.path[0] === 'note')?.message;
    const evidenceError =
      evidenceRef.trim() === '' && reports === 0 && uploaded.length === 0
        ? 'Add a photo or a document reference, or wait for the operator’s corrective-action report.'
        : undefined;
    if (!checked.success || evidenceError) {
      setErrors({ note: noteError, evidence: evidenceError });
      return;
    }
    change.mutate({ findingId: finding.id, input: checked.data }, { onSuccess: onDone });
  };
  return (
    <View style={styles.panel} accessibilityLabel={title}>
      <Text variant="heading">{title}</Text>
      <Text variant="small" muted>
        Close it once you have checked that the deficiency is put right. Closing does not return the ride to
        service: when this is its last finding that forbids operation, a follow-up inspection is booked, and
        its approval does.
      </Text>
      <TextField
        label="Verification note"
        value={note}
        onChangeText={(t) => {
          setNote(t);
          setErrors((e) => ({ ...e, note: undefined }));
        }}
        multiline
        error={errors.note}
        hint="What you checked and found: seen on site, measured, tested…"
      />
      <TextField
        label={reports > 0 ? 'Evidence reference (optional)' : 'Evidence reference'}
        value={evidenceRef}
        onChangeText={(t) => {
          setEvidenceRef(t);
          setErrors((e) => ({ ...e, evidence: undefined }));
        }}
        error={errors.evidence}
        hint={
          reports > 0
            ? `The operator’s corrective-action report${reports > 1 ? 's' : ''} (${reports}) on this finding count as evidence; add a work order, NDT or maker’s report number if you have one.`
            : 'A work order, NDT or maker’s report number. Or add a photo of the corrected part, or wait for the operator’s corrective-action report.'
        }
      />
      <View style={styles.buttons}>
        <Button label="Take a photo" tone="quiet" onPress={() => void addPhoto('camera')} />
        <Button label="Choose from library" tone="quiet" onPress={() => void addPhoto('library')} />
      </View>
      {shots.length > 0 ? (
        <Text variant="small" accessibilityLiveRegion="polite">
          {shots
            .map(
              (p, i) =>
                `Photo ${i + 1}: ${p.state === 'uploaded' ? '✓ uploaded' : p.state === 'failed' ? 'not uploaded, add it again' : 'uploading…'}`,
            )
            .join(' · ')}
        </Text>
      ) : null}
      <FormAlert problem={change.error ? { message: problemText(change.error) } : null} />
      <View style={styles.buttons}>
        <Button label="Close finding" tone="accent" onPress={submit} busy={change.isPending} />
        <Button label="Cancel" tone="quiet" onPress={onCancel} disabled={change.isPending} />
      </View>
    </View>
  );
}

function ReopenPanel({ noticeId, finding, userName, onDone, onCancel }: PanelProps) {
  return (
    <NotePanel
      title={`Reopen finding ${finding.number}`}
      intro="The operator sees your comment. A reopened finding that forbids operation takes a ride in service out of service."
      noteLabel="What is still wrong"
      submitLabel="Reopen finding"
      submitTone="danger"
      schema={findingReopenInputSchema}
      change={useReopenFinding(noticeId, userName)}
      finding={finding}
      onDone={onDone}
      onCancel={onCancel}
    />
  );
}

/** The part of a finding change (close or reopen) the panel uses. */
type NoteChange<I> = {
  mutate: (
    change: { findingId: string; input: I },
    options: { onSuccess: (answer: FindingStateResponse) => void },
  ) => void;
  isPending: boolean;
  error: unknown;
};

/** A verifier's form for closing or reopening a finding: a note checked by the schema, then sent. */
function NotePanel<I>({
  title,
  intro,
  noteLabel,
  noteHint,
  submitLabel,
  submitTone,
  schema,
  change,
  finding,
  onDone,
  onCancel,
}: {
  title: string;
  intro: string;
  noteLabel: string;
  noteHint?: string;
  submitLabel: string;
  submitTone: 'accent' | 'danger';
  schema: z.ZodType<I>;
  change: NoteChange<I>;
  finding: NoticeFinding;
  onDone: (answer: FindingStateResponse) => void;
  onCancel: () => void;
}) {
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | undefined>();
  const submit = () => {
    const checked = schema.safeParse({ note });
    if (!checked.success) {
      setError(checked.error.issues[0]?.message);
      return;
    }
    change.mutate({ findingId: finding.id, input: checked.data }, { onSuccess: onDone });
  };
  return (
    <View style={styles.panel} accessibilityLabel={title}>
      <Text variant="heading">{title}</Text>
      <Text variant="small" muted>
        {intro}
      </Text>
      <TextField
        label={noteLabel}
        value={note}
        onChangeText={(t) => {
          setNote(t);
          setError(undefined);
        }}
        multiline
        error={error}
        hint={noteHint}
      />
      <FormAlert problem={change.error ? { message: problemText(change.error) } : null} />
      <View style={styles.buttons}>
        <Button label={submitLabel} tone={submitTone} onPress={submit} busy={change.isPending} />
        <Button label="Cancel" tone="quiet" onPress={onCancel} disabled={change.isPending} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  card: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  head: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  story: { gap: 2 },
  reopened: {
    padding: space.sm,
    borderLeftWidth: 3,
    borderLeftColor: colors.near,
    backgroundColor: colors.nearSoft,
    borderRadius: radius.sm,
  },
  actions: { gap: space.sm, paddingTop: space.xs },
  action: {
    gap: space.xs,
    padding: space.sm,
    borderRadius: radius.sm,
    backgroundColor: colors.bg,
  },
  saving: { borderWidth: 1, borderStyle: 'dashed', borderColor: colors.focus },
  buttons: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  panel: {
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.base,
    backgroundColor: colors.surface,
  },
  outcome: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    backgroundColor: colors.surfaceSunk,
  },
  outcomeRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  link: { minHeight: layout.touchTarget, justifyContent: 'center' },
});
