import { Link } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { LabelledLine } from '@/components/labelled-line';
import { RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import type { SessionUser } from '@/features/session/schema';
import { CorrectiveActionForm } from '@/features/notices/corrective-action-form';
import { NoticePhotos } from '@/features/notices/notice-photos';
import { noticeHref } from '@/features/notices/hrefs';
import { isPastDue, todayIso } from '@/features/notices/notice-text';
import { SAVING_PREFIX } from '@/features/notices/notices-api';
import type { FindingStateResponse, NoticeFinding } from '@/features/notices/schema';
import { formatDate, formatDateTime } from '@/lib/dates';
import { FindingStateMark } from '@/features/notices/finding-state-mark';
import { SeverityMark } from '@/features/notices/severity-mark';
import { ClosePanel, type PanelProps, ReopenPanel } from '@/features/notices/finding-panels';

/** Who may verify findings: the server's verifiers (supervisor, admin, inspector). */
const isVerifier = (user: SessionUser) =>
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

      <CorrectiveActions finding={f} operator={operator} />

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

/** The operator's corrective-action reports on the finding; one still being sent is marked so. */
function CorrectiveActions({ finding: f, operator }: { finding: NoticeFinding; operator: boolean }) {
  return (
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
  outcome: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    backgroundColor: colors.surfaceSunk,
  },
  outcomeRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  link: { minHeight: layout.touchTarget, justifyContent: 'center' },
});
