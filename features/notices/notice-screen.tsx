import { Link, useLocalSearchParams } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Spinner } from '@/components/spinner';
import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { FormAlert } from '@/components/form-alert';
import { Column, Columns } from '@/components/screen';
import { Segmented } from '@/components/segmented';
import { RideStatusMark } from '@/components/status-mark';
import { SubScreen } from '@/components/sub-screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';
import { DownloadProgressBar, handOverVerb, useDownloadProgress } from '@/features/api/ui';
import { useSession } from '@/features/auth';
import type { SessionUser } from '@/features/session/schema';
import { problemText } from '@/features/notices/corrective-action-form';
import { FindingLoop } from '@/features/notices/finding-loop';
import { noticesHref } from '@/features/notices/hrefs';
import { NoticeDocumentView } from '@/features/notices/notice-document-view';
import { NoticeSummary } from '@/features/notices/notice-summary';
import { deliveryStatusLabel, noticeKindLabel } from '@/features/notices/notice-text';
import { useAcknowledge, useNotice, useResend } from '@/features/notices/notices-api';
import { type PaperSize, downloadNoticePdf } from '@/features/notices/pdf-download';
import { type NoticeDetail, noticeDeliveryStateInfo, noticePaperOf } from '@/features/notices/schema';
import { formatDate, formatDateTime } from '@/lib/dates';
import { NoticeDeliveryMark } from '@/features/notices/notice-delivery-mark';
import { useRideQuery } from '@/features/registry/ui';

const back = { href: noticesHref, label: 'Notices' } as const;

/**
 * One notice (/notices/:id), the page the e-mail links to, in order of what the reader must do: what the
 * notice asks (operating status, re-inspection, what to do by when, the caution), the acknowledgement,
 * each finding's loop as it stands now, the ride's status now, then the document as issued (its results
 * folded on a phone), its PDF and, for staff, the e-mail deliveries. A phone shows that order in one
 * column; a desktop puts the summary and the document on the left, what can be done on the right.
 */
export function NoticeScreen() {
  const params = useLocalSearchParams<{ id?: string }>();
  const id = typeof params.id === 'string' ? params.id : '';
  const session = useSession();
  const user = session.data?.user;
  const notice = useNotice(id, !!user);
  if (!user) return null;

  if (notice.isPending)
    return (
      <SubScreen title="Notice" back={back}>
        <View style={styles.wait} accessibilityLabel="Loading the notice">
          <Spinner color={colors.base} />
        </View>
      </SubScreen>
    );
  if (notice.error || !notice.data) return <NoticeTrouble error={notice.error} retry={notice.refetch} />;
  return <NoticePage notice={notice.data} user={user} />;
}

function NoticeTrouble({ error, retry }: { error: unknown; retry: () => unknown }) {
  const missing = error instanceof ApiRequestError && error.status === 404;
  return (
    <SubScreen title={missing ? 'Notice not found' : 'Notice'} back={back}>
      <Card role="alert">
        {missing ? (
          <>
            <Text variant="heading">This notice is not here for you.</Text>
            <Text>
              It does not exist, or it was issued to another company. If the link came in an e-mail to your
              company, check that you are signed in with your own company’s account.
            </Text>
          </>
        ) : (
          <>
            <Text variant="heading">
              {error instanceof OfflineError
                ? 'No connection, so the notice could not be loaded.'
                : 'The notice could not be loaded.'}
            </Text>
            <Button label="Try again" tone="quiet" onPress={() => retry()} />
          </>
        )}
        <Link href={noticesHref} asChild>
          <Pressable role="link" style={styles.link}>
            <Text variant="heading" color={colors.accent}>
              Go to the list of notices
            </Text>
          </Pressable>
        </Link>
      </Card>
    </SubScreen>
  );
}

function NoticePage({ notice, user }: { notice: NoticeDetail; user: SessionUser }) {
  const wide = useWide();
  const staff = user.role !== 'operator';
  const issuedOn = `As issued on ${formatDate(notice.issuedAt)}`;

  const summary = <NoticeSummary notice={notice} />;
  const acknowledgement = <AcknowledgementPanel notice={notice} user={user} />;
  const document = (
    <View style={styles.block}>
      <Text variant="label" muted role="heading" aria-level={2}>
        {issuedOn.toUpperCase()}
      </Text>
      <NoticeDocumentView document={notice.document} />
    </View>
  );
  const findings = <FindingsNow notice={notice} user={user} />;
  const rideNow = <RideNow rideId={notice.rideId} />;
  const pdf = <PdfPanel notice={notice} />;
  const deliveries = staff ? <DeliveriesPanel notice={notice} user={user} /> : null;

  return (
    <SubScreen
      title={notice.reference}
      subtitle={`${noticeKindLabel[notice.kind]} · ${notice.rideName} · ${notice.operatorName} · as issued on ${formatDate(notice.issuedAt)}`}
      back={back}
      wideContent
    >
      {wide ? (
        <>
          <Columns>
            <Column grow={3}>{summary}</Column>
            <Column grow={2}>
              {acknowledgement}
              {rideNow}
            </Column>
          </Columns>
          <Columns>
            <Column grow={3}>{document}</Column>
            <Column grow={2}>
              {findings}
              {pdf}
              {deliveries}
            </Column>
          </Columns>
        </>
      ) : (
        <>
          {summary}
          {acknowledgement}
          {findings}
          {rideNow}
          {document}
          {pdf}
          {deliveries}
        </>
      )}
    </SubScreen>
  );
}

// ——— the PDF ———

function PdfPanel({ notice }: { notice: NoticeDetail }) {
  // The paper the notice was issued on (its company's choice); the other stays a choice for printing.
  const [size, setSize] = useState<PaperSize>(noticePaperOf(notice.document));
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const pdfProgress = useDownloadProgress();
  const download = async () => {
    setBusy(true);
    setMessage(null);
    try {
      setMessage({ ok: true, text: await downloadNoticePdf(notice, size, pdfProgress.track) });
    } catch (err) {
      setMessage({ ok: false, text: `The PDF could not be downloaded. ${problemText(err)}` });
    } finally {
      setBusy(false);
      pdfProgress.clear();
    }
  };
  return (
    <Card>
      <Text variant="heading" role="heading" aria-level={2}>
        PDF of the notice
      </Text>
      <Text variant="small" muted>
        The same notice as the e-mail’s attachment, to file or print.
      </Text>
      <Segmented<PaperSize>
        label="Paper size"
        value={size}
        onChange={setSize}
        options={[
          { value: 'A4', label: 'A4' },
          { value: 'LETTER', label: 'Letter' },
        ]}
      />
      <Button
        label={`${handOverVerb} PDF`}
        tone="quiet"
        icon={<Feather name="download" size={18} color={colors.text} />}
        onPress={download}
        busy={busy}
      />
      <DownloadProgressBar progress={pdfProgress.progress} label="PDF of the notice" />
      {message ? (
        <Text
          variant="small"
          color={message.ok ? colors.within : colors.danger}
          accessibilityLiveRegion="polite"
        >
          {message.ok ? '✓ ' : ''}
          {message.text}
        </Text>
      ) : null}
    </Card>
  );
}

// ——— acknowledgement ———

function AcknowledgementPanel({ notice, user }: { notice: NoticeDetail; user: SessionUser }) {
  const acknowledge = useAcknowledge(notice.id, user.name);
  const operator = user.role === 'operator';
  const done = notice.acknowledgedAt !== null;
  return (
    <Card style={done ? undefined : styles.ackOpen}>
      <Text variant="heading" role="heading" aria-level={2}>
        Acknowledgement
      </Text>
      {done ? (
        <View style={styles.ackDone} accessibilityLiveRegion="polite">
          <Feather name="check-circle" size={20} color={colors.within} />
          <Text style={styles.grow}>
            Acknowledged by {notice.acknowledgedByName ?? 'the operator'},{' '}
            {formatDateTime(notice.acknowledgedAt ?? '')}
          </Text>
        </View>
      ) : operator ? (
        <>
          <Text>
            Confirm that your company has received this notice. Your name and the time are recorded; it does
            not mean you agree with it.
          </Text>
          <FormAlert
            problem={
              acknowledge.error ? { message: `Not acknowledged. ${problemText(acknowledge.error)}` } : null
            }
          />
          <Button
            label="Acknowledge receipt"
            tone="accent"
            style={styles.bigButton}
            onPress={() => acknowledge.mutate()}
            busy={acknowledge.isPending}
            icon={<Feather name="check" size={20} color={colors.baseText} />}
          />
        </>
      ) : (
        <View style={styles.ackDone}>
          <Feather name="clock" size={20} color={colors.near} />
          <Text style={styles.grow}>Not yet acknowledged by the operator.</Text>
        </View>
      )}
    </Card>
  );
}

// ——— the ride now ———

function RideNow({ rideId }: { rideId: string }) {
  const ride = useRideQuery(rideId);
  if (!ride.data) return null;
  const r = ride.data.ride;
  return (
    <Card accessibilityLabel="Ride status now">
      <View style={styles.rideRow}>
        <Text variant="heading" role="heading" aria-level={2} style={styles.grow}>
          {r.name}: status now
        </Text>
        <RideStatusMark status={r.status} />
      </View>
      {r.statusReason ? <Text variant="small">{r.statusReason}</Text> : null}
      {r.statusSince ? (
        <Text variant="small" muted>
          Since {formatDateTime(r.statusSince)}
        </Text>
      ) : null}
    </Card>
  );
}

// ——— findings now ———

function FindingsNow({ notice, user }: { notice: NoticeDetail; user: SessionUser }) {
  const open = notice.findings.filter((f) => f.state !== 'closed').length;
  return (
    <View style={styles.block}>
      <View>
        <Text variant="title" role="heading" aria-level={2}>
          Findings now
        </Text>
        <Text variant="small" muted>
          {notice.findings.length === 0
            ? 'This notice lists no findings.'
            : `Where each finding stands today · ${open} of ${notice.findings.length} not yet closed`}
        </Text>
      </View>
      {notice.findings.length > 0 ? (
        <View style={styles.block} role="list" accessibilityLabel="Findings now">
          {notice.findings.map((f) => (
            <FindingLoop key={f.id} noticeId={notice.id} finding={f} user={user} />
          ))}
        </View>
      ) : null}
    </View>
  );
}

// ——— e-mail deliveries (staff) ———

function DeliveriesPanel({ notice, user }: { notice: NoticeDetail; user: SessionUser }) {
  const resend = useResend(notice.id);
  const mayResend = user.role === 'supervisor' || user.role === 'admin';
  const info = noticeDeliveryStateInfo[notice.delivery.state];
  return (
    <Card>
      <Text variant="heading" role="heading" aria-level={2}>
        E-mail deliveries
      </Text>
      <NoticeDeliveryMark state={notice.delivery.state} />
      <Text variant="small">{info.description}</Text>
      {notice.deliveries.length > 0 ? (
        <View style={styles.deliveries} role="list" accessibilityLabel="Deliveries">
          {notice.deliveries.map((d) => (
            <View key={d.id} style={styles.delivery} role="listitem" accessibilityLabel={d.recipient}>
              <View style={styles.rideRow}>
                <Text variant="heading" style={styles.grow} numberOfLines={1}>
                  {d.recipient}
                </Text>
                <Text variant="label" color={d.status === 'failed' ? colors.danger : colors.text}>
                  {d.status === 'sent' ? '✓ ' : d.status === 'failed' ? '✕ ' : '… '}
                  {deliveryStatusLabel[d.status]}
                </Text>
              </View>
              <Text variant="small" muted>
                {d.attempts} {d.attempts === 1 ? 'attempt' : 'attempts'}
                {d.sentAt ? ` · sent ${formatDateTime(d.sentAt)}` : ''}
                {d.nextAttemptAt ? ` · next try ${formatDateTime(d.nextAttemptAt)}` : ''}
              </Text>
              {d.lastError ? (
                <Text variant="small" color={colors.danger}>
                  Last error: {d.lastError}
                </Text>
              ) : null}
            </View>
          ))}
        </View>
      ) : null}
      {mayResend ? (
        <>
          <Button
            label="Send again"
            tone="quiet"
            icon={<Feather name="send" size={18} color={colors.text} />}
            onPress={() => resend.mutate()}
            busy={resend.isPending}
          />
          <Text variant="small" muted>
            Sends the notice to notice addresses that have not had it (added since, or after a failure); never
            twice to one address.
          </Text>
          {resend.data ? (
            <Text variant="small" accessibilityLiveRegion="polite">
              {resend.data.queued === 0
                ? 'Nothing to send: every notice address has already received it.'
                : `Queued for ${resend.data.queued} ${resend.data.queued === 1 ? 'address' : 'addresses'}.`}
            </Text>
          ) : null}
          <FormAlert problem={resend.error ? { message: problemText(resend.error) } : null} />
        </>
      ) : null}
    </Card>
  );
}

const styles = StyleSheet.create({
  wait: { padding: space.xl, alignItems: 'center' },
  link: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
  block: { gap: space.md },
  grow: { flex: 1, minWidth: 0 },
  ackOpen: { borderColor: colors.accent, borderWidth: 2 },
  ackDone: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  bigButton: { minHeight: 56 },
  rideRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  deliveries: { gap: space.sm },
  delivery: { gap: 2, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.bg },
});
