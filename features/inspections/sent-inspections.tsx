import { Link, router } from 'expo-router';
import { memo, useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { Card } from '@/components/card';
import Feather from '@/components/feather-icon';
import { SectionTitle } from '@/components/screen';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import { useStartCorrectionMutation, useStartInspectionMutation } from '@/features/inspections/field-api';
import { inspectHref } from '@/features/inspections/hrefs';
import { ReportDownload } from '@/features/inspections/report-download';
import { inspectionTypeLabel } from '@/features/records/schema';
import { rideHref } from '@/features/rides';
import { type FindingView, type SentInspection, groupSent } from '@/features/inspections/sent';
import { formatDate, formatDateTime } from '@/lib/dates';
import type { FindingSeverity } from '@/features/review/schema';

type FeatherName = React.ComponentProps<typeof Feather>['name'];

/** Where a sent inspection stands, as an icon shape, words and a colour together. */
type Stage = 'returned' | 'corrected' | 'approved' | 'awaiting' | 'waiting' | 'refused' | 'other';

const stages: Record<Stage, { label: string; icon: FeatherName; fg: string; bg: string }> = {
  returned: {
    label: 'Returned for correction',
    icon: 'corner-up-left',
    fg: colors.over,
    bg: colors.overSoft,
  },
  corrected: { label: 'Returned · correction sent', icon: 'repeat', fg: colors.near, bg: colors.nearSoft },
  approved: { label: 'Approved', icon: 'check-circle', fg: colors.within, bg: colors.withinSoft },
  awaiting: { label: 'Sent · awaiting review', icon: 'clock', fg: colors.textMuted, bg: colors.surfaceSunk },
  waiting: { label: 'Waiting to send', icon: 'upload', fg: colors.textMuted, bg: colors.surfaceSunk },
  refused: { label: 'Refused by the server', icon: 'x-octagon', fg: colors.over, bg: colors.overSoft },
  other: { label: 'Decided', icon: 'info', fg: colors.textMuted, bg: colors.surfaceSunk },
};

function stageOf(s: SentInspection): Stage {
  if (s.decision?.state === 'returned') return s.needsAction ? 'returned' : 'corrected';
  if (s.decision?.state === 'approved') return 'approved';
  if (s.decision) return 'other';
  if (s.send === 'waiting') return 'waiting';
  if (s.send === 'refused') return 'refused';
  return 'awaiting';
}

function StageMark({ stage, text }: { stage: Stage; text?: string }) {
  const spec = stages[stage];
  return (
    <View style={StyleSheet.flatten([styles.mark, { backgroundColor: spec.bg }])}>
      <Feather name={spec.icon} size={18} color={spec.fg} />
      <Text variant="heading" color={spec.fg}>
        {text ?? spec.label}
      </Text>
    </View>
  );
}

const severityIcon: Record<FindingSeverity, FeatherName> = {
  note: 'info',
  fix_by_date: 'calendar',
  fix_before_operation: 'alert-triangle',
  stop_now: 'octagon',
};

function severityColour(s: FindingSeverity | null): string {
  if (s === 'stop_now' || s === 'fix_before_operation') return colors.over;
  if (s === 'fix_by_date') return colors.near;
  return colors.text;
}

/** The supervisor's findings, in number order, each with its severity in words. */
function FindingList({ findings }: { findings: FindingView[] }) {
  return (
    <View style={styles.findings} role="list" accessibilityLabel="Findings">
      {findings.map((f) => (
        <View key={f.key} style={styles.finding} role="listitem">
          <View style={styles.findingHead}>
            <Feather
              name={f.severity ? severityIcon[f.severity] : 'help-circle'}
              size={18}
              color={severityColour(f.severity)}
            />
            <Text variant="heading" color={severityColour(f.severity)} style={styles.shrink}>
              {`Finding ${f.number} · ${f.severityLabel}`}
            </Text>
          </View>
          <Text>{f.description}</Text>
          {f.requiredAction ? (
            <View style={styles.action}>
              <Text variant="label" muted>
                REQUIRED ACTION
              </Text>
              <Text>{f.requiredAction}</Text>
            </View>
          ) : null}
          {f.dueOn || f.stateLabel ? (
            <Text variant="small" muted>
              {[f.dueOn ? `Due ${formatDate(f.dueOn)}` : null, f.stateLabel].filter(Boolean).join(' · ')}
            </Text>
          ) : null}
        </View>
      ))}
    </View>
  );
}

function byLine(s: SentInspection): string | null {
  const d = s.decision;
  if (!d) return null;
  const who = d.decidedByName ?? 'a supervisor';
  return `${d.state === 'approved' ? 'Approved' : d.state === 'returned' ? 'Returned' : 'Decided'} by ${who}${
    d.decidedAt ? `, ${formatDateTime(d.decidedAt)}` : ''
  }`;
}

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/** One sent inspection with its decision. Returned ones show the comment and findings in full. */
function SentCard({ item }: { item: SentInspection }) {
  const stage = stageOf(item);
  const correct = useStartCorrectionMutation();
  const start = useStartInspectionMutation();
  const open = stage === 'returned';
  const [showFindings, setShowFindings] = useState(open);
  const d = item.decision;
  const findings = d?.findings ?? [];
  const title = `${item.rideName}${item.type ? ` · ${inspectionTypeLabel[item.type]}` : ''}`;
  return (
    <Card
      style={open ? styles.returnedCard : undefined}
      accessibilityLabel={`${title}: ${stages[stage].label}`}
    >
      <View style={styles.shrink}>
        {item.rideId ? (
          // The ride's name opens the ride's page (its status, schedule and Start inspection).
          <Link href={rideHref(item.rideId)} asChild>
            <Pressable role="link" style={styles.name}>
              <Text variant="heading" color={colors.accent}>
                {title} ›
              </Text>
            </Pressable>
          </Link>
        ) : (
          <Text variant="heading">{title}</Text>
        )}
        <Text variant="small" muted>
          {item.submittedAt ? `Submitted ${formatDateTime(item.submittedAt)}` : 'Sent from another device'}
          {item.amends ? ' · a correction' : ''}
        </Text>
      </View>
      <StageMark stage={stage} />
      {d ? (
        <Text variant="small" muted>
          {byLine(item)}
        </Text>
      ) : null}
      {d?.note ? (
        <View style={StyleSheet.flatten([styles.note, open && styles.noteReturned])}>
          <Text variant="label" muted>
            {d.state === 'returned' ? 'WHAT TO CORRECT' : 'SUPERVISOR’S COMMENT'}
          </Text>
          <Text variant={open ? 'heading' : 'body'} style={open ? styles.noteText : undefined}>
            {d.note}
          </Text>
        </View>
      ) : null}
      {findings.length > 0 ? (
        open ? (
          <FindingList findings={findings} />
        ) : (
          <>
            <Button
              label={
                showFindings ? 'Hide findings' : `Show ${plural(findings.length, 'finding', 'findings')}`
              }
              tone="quiet"
              aria-expanded={showFindings}
              onPress={() => setShowFindings((v) => !v)}
            />
            {showFindings ? <FindingList findings={findings} /> : null}
          </>
        )
      ) : null}
      {item.decision?.state === 'returned' && item.correction?.state === 'draft' ? (
        <Button
          label="Resume the correction"
          onPress={() => router.push(inspectHref(item.correction?.id ?? ''))}
        />
      ) : stage === 'returned' && item.canCorrect ? (
        <>
          <Button
            label="Correct and resubmit"
            busy={correct.isPending}
            onPress={() =>
              correct.mutate(item.id, { onSuccess: (draft) => router.push(inspectHref(draft.id)) })
            }
          />
          <Text variant="small" muted>
            Opens a copy of this inspection with everything you recorded. Change what the supervisor asked
            for, then submit it; it goes as a correction of this one.
          </Text>
        </>
      ) : stage === 'returned' && item.rideId ? (
        <>
          <Button
            label="Start a new inspection of this ride"
            busy={start.isPending}
            onPress={() =>
              start.mutate(
                { rideId: item.rideId ?? '', type: item.type ?? 'periodic' },
                { onSuccess: (draft) => router.push(inspectHref(draft.id)) },
              )
            }
          />
          <Text variant="small" muted>
            This inspection was sent from another device, so it cannot be copied here. The new inspection
            starts empty: record the ride again with the corrections asked for above.
          </Text>
        </>
      ) : stage === 'returned' ? (
        <Text variant="small" muted>
          This inspection was sent from another device, so it cannot be copied here. Start a new inspection of
          the ride with the corrections.
        </Text>
      ) : null}
      {item.send === 'sent' || item.send === 'unknown' ? <ReportDownload inspection={item} /> : null}
      {correct.isError || start.isError ? (
        <Text role="alert" color={colors.danger}>
          {(correct.error ?? start.error)?.message}
        </Text>
      ) : null}
    </Card>
  );
}

const RECENT = 5;

/**
 * The Today screen's part for sent inspections: returned ones first, under their own heading, since they
 * need the inspector; then those still on this phone (waiting, or refused by the server) under headings
 * that say so — an inspection is listed as sent only once the server has it; then the most recent of the
 * sent ones, with the whole list a press away.
 */
export const SentInspections = memo(function SentInspections({ list }: { list: SentInspection[] }) {
  const [all, setAll] = useState(false);
  const { returned, waiting, refused, sent } = groupSent(list);
  const shown = all ? sent : sent.slice(0, RECENT);
  const group = (title: string, items: SentInspection[]) =>
    items.length > 0 ? (
      <>
        <SectionTitle>{`${title} (${items.length})`}</SectionTitle>
        {items.map((s) => (
          <SentCard key={s.id} item={s} />
        ))}
      </>
    ) : null;
  return (
    <>
      {group('Returned to you', returned)}
      {group('Waiting to send', waiting)}
      {group('Refused by the server', refused)}
      {sent.length > 0 ? (
        <>
          <SectionTitle>{`Sent (${sent.length})`}</SectionTitle>
          {shown.map((s) => (
            <SentCard key={s.id} item={s} />
          ))}
          {sent.length > RECENT ? (
            <Button
              label={all ? 'Show only the latest' : `Show all ${sent.length} sent`}
              tone="quiet"
              onPress={() => setAll((v) => !v)}
            />
          ) : null}
        </>
      ) : null}
    </>
  );
});

const styles = StyleSheet.create({
  shrink: { flexShrink: 1, gap: 2 },
  name: { minHeight: layout.touchTarget, justifyContent: 'center', alignSelf: 'flex-start' },
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.sm,
    paddingHorizontal: space.md,
    paddingVertical: space.xs + 2,
    borderRadius: radius.sm,
  },
  returnedCard: { borderColor: colors.over, borderWidth: 2, borderLeftWidth: 8 },
  note: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    backgroundColor: colors.surfaceSunk,
  },
  noteReturned: { backgroundColor: colors.overSoft },
  // Big enough to read at arm's length in sunlight: it is what the inspector has to act on.
  noteText: { fontSize: 19, lineHeight: 27 },
  findings: { gap: space.sm },
  finding: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  action: { gap: 2 },
  findingHead: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
});
