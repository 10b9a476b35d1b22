import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { CAUTION_FULL, Caution } from '@/components/caution';
import { DataTable } from '@/components/data-table';
import { DisclosureToggle } from '@/components/disclosure-toggle';
import { LabelledLine } from '@/components/labelled-line';
import { EnvelopeMark, RideStatusMark } from '@/components/status-mark';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';
import { NoticePhotos } from '@/features/notices/notice-photos';
import { noticeKindLabel } from '@/features/notices/notice-text';
import { noticeUnitsText, type NoticeDocument } from '@/features/notices/schema';
import { formatRatio } from '@/features/loads';
import { formatDate, formatWhen } from '@/lib/dates';
import { SeverityMark } from '@/features/notices/severity-mark';

type Result = NoticeDocument['results'][number];
type Load = NoticeDocument['loadSummary'][number];

/**
 * The notice exactly as it was issued: the frozen document the operator received by e-mail and in the
 * PDF. Nothing here reads the findings as they stand now; the finding loop beside it does that.
 */
export function NoticeDocumentView({ document: doc }: { document: NoticeDocument }) {
  const inspection = doc.inspection;
  return (
    <Card style={styles.card} accessibilityLabel={`Notice ${doc.reference} as issued`}>
      <IssuerHead doc={doc} />

      <Section title="To">
        <Text variant="heading">{doc.operator.name}</Text>
        {doc.operator.address ? <Text variant="small">{doc.operator.address}</Text> : null}
      </Section>

      <RideFacts doc={doc} />

      {inspection ? <InspectionFacts doc={doc} inspection={inspection} /> : null}

      <OperatingStatus doc={doc} />

      <FindingsAsIssued findings={doc.findings} />

      <ResultsFold doc={doc}>
        <ResultsAsIssued doc={doc} />
        {doc.pivotLife ? <PivotLifeAsIssued life={doc.pivotLife} /> : null}
      </ResultsFold>

      {doc.note ? (
        <Section title="Note from the inspection body">
          <Text>{doc.note}</Text>
        </Section>
      ) : null}

      <Section title="Signed">
        <Text>
          {doc.signature.name}, {doc.signature.role} — {formatWhen(doc.signature.signedAt, doc.timeZone)}
        </Text>
      </Section>

      <Section title="If you disagree">
        <Text variant="small">{doc.appeal}</Text>
      </Section>

      <Caution full />
      {doc.caution !== CAUTION_FULL ? (
        <View style={styles.printed}>
          <Text variant="label" muted>
            CAUTION AS PRINTED ON THIS NOTICE
          </Text>
          <Text variant="small">{doc.caution}</Text>
        </View>
      ) : null}
    </Card>
  );
}

/** Who issued the notice, and its kind, reference and time of issue. */
function IssuerHead({ doc }: { doc: NoticeDocument }) {
  const wide = useWide();
  return (
    <View style={StyleSheet.flatten([styles.top, wide && styles.topWide])}>
      <View style={wide ? styles.grow : undefined}>
        <Text variant="heading">{doc.issuer.name}</Text>
        {doc.issuer.address ? (
          <Text variant="small" muted>
            {doc.issuer.address}
          </Text>
        ) : null}
        {doc.issuer.phone ? (
          <Text variant="small" muted>
            {doc.issuer.phone}
          </Text>
        ) : null}
      </View>
      <View style={wide ? styles.refWide : undefined}>
        <Text variant="label" muted>
          {noticeKindLabel[doc.kind].toUpperCase()}
        </Text>
        <Text variant="figureLarge">{doc.reference}</Text>
        <Text variant="small" muted>
          Issued {formatWhen(doc.issuedAt, doc.timeZone)}
        </Text>
      </View>
    </View>
  );
}

function RideFacts({ doc }: { doc: NoticeDocument }) {
  const rideLine = [doc.ride.maker, doc.ride.model].filter(Boolean).join(' ');
  return (
    <Section title="Ride">
      <Facts>
        <Fact label="Ride" value={doc.ride.name} />
        <Fact label="Class" value={doc.ride.rideClass} />
        {rideLine ? <Fact label="Maker and model" value={rideLine} /> : null}
        {doc.ride.serial ? <Fact label="Serial number" value={doc.ride.serial} /> : null}
        {doc.ride.year !== null ? <Fact label="Year built" value={String(doc.ride.year)} /> : null}
        <Fact
          label="Site"
          value={doc.site ? [doc.site.name, doc.site.address].filter(Boolean).join(', ') : 'No site recorded'}
        />
      </Facts>
    </Section>
  );
}

function InspectionFacts({
  doc,
  inspection,
}: {
  doc: NoticeDocument;
  inspection: NonNullable<NoticeDocument['inspection']>;
}) {
  return (
    <Section title="Inspection">
      <Facts>
        <Fact label="Type" value={inspection.typeLabel} />
        <Fact label="Date" value={formatDate(inspection.date)} />
        <Fact
          label="Inspector"
          value={
            inspection.inspectorCredential
              ? `${inspection.inspectorName} (${inspection.inspectorCredential})`
              : inspection.inspectorName
          }
        />
        {inspection.designVersion !== null ? (
          <Fact label="Design data" value={`Version ${inspection.designVersion}`} />
        ) : null}
        {inspection.engineVersion ? <Fact label="Load engine" value={inspection.engineVersion} /> : null}
        {doc.checklist ? (
          <Fact label="Checklist" value={`${doc.checklist.failed} of ${doc.checklist.total} items failed`} />
        ) : null}
      </Facts>
    </Section>
  );
}

/** The ride's operating status and whether it must be inspected again, as the notice states them. */
function OperatingStatus({ doc }: { doc: NoticeDocument }) {
  return (
    <Section title="Operating status">
      <View style={styles.statusRow}>
        <RideStatusMark status={doc.operatingStatus.status} />
        {doc.operatingStatus.reason ? <Text style={styles.grow}>{doc.operatingStatus.reason}</Text> : null}
      </View>
      <Text>
        <Text variant="label" muted>
          RE-INSPECTION{' '}
        </Text>
        {doc.reinspection.required ? 'Required' : 'Not required'}
        {doc.reinspection.reason ? ` — ${doc.reinspection.reason}` : ''}
      </Text>
    </Section>
  );
}

/** The findings with their photos, as issued (not as they stand now). */
function FindingsAsIssued({ findings }: { findings: NoticeDocument['findings'] }) {
  if (findings.length === 0) return null;
  return (
    <Section title={`Findings (${findings.length})`}>
      <View style={styles.findings} role="list" accessibilityLabel="Findings as issued">
        {findings.map((f) => (
          <View
            key={f.id}
            style={styles.finding}
            role="listitem"
            accessibilityLabel={`Finding ${f.number} as issued`}
          >
            <View style={styles.findingHead}>
              <Text variant="heading">Finding {f.number}</Text>
              <SeverityMark severity={f.severity} compact />
            </View>
            <Text>{f.description}</Text>
            {f.ruleRef ? <LabelledLine label="Breaches" value={f.ruleRef} /> : null}
            {f.requiredAction ? <LabelledLine label="Required action" value={f.requiredAction} /> : null}
            <LabelledLine label="Due" value={f.dueOn ? formatDate(f.dueOn) : 'No due date'} />
            <NoticePhotos photos={f.photos} label={`Photos of finding ${f.number} (${f.photos.length})`} />
          </View>
        ))}
      </View>
    </Section>
  );
}

/**
 * The results, load summary and pivot life behind a disclosure: folded on a phone, where they ran to
 * several screens between the operator and the rest of the notice; open on a desktop. The toggle says
 * what is folded and how many values are over or near their limits, so nothing alarming hides unseen.
 */
function ResultsFold({ doc, children }: { doc: NoticeDocument; children: React.ReactNode }) {
  const wide = useWide();
  const [open, setOpen] = useState(wide);
  if (doc.results.length === 0 && doc.loadSummary.length === 0 && !doc.pivotLife) return null;
  const over = doc.results.filter((r) => r.status === 'over').length;
  const near = doc.results.filter((r) => r.status === 'near').length;
  const parts = [
    doc.results.length > 0 ? `${doc.results.length} ${doc.results.length === 1 ? 'value' : 'values'}` : null,
    over > 0 ? `${over} over limit` : null,
    near > 0 ? `${near} near limit` : null,
  ].filter(Boolean);
  const counted = parts.length > 0 ? ` (${parts.join(', ')})` : '';
  return (
    <View style={styles.section} accessibilityLabel="Results as issued">
      <DisclosureToggle
        open={open}
        onToggle={() => setOpen(!open)}
        label={open ? 'Hide the full results' : `Show the full results${counted}`}
      />
      {open ? children : null}
    </View>
  );
}

/** The results against design limits and the peak pivot loads the notice was issued with. */
function ResultsAsIssued({ doc }: { doc: NoticeDocument }) {
  return (
    <>
      {doc.results.length > 0 || doc.loadSummary.length > 0 ? (
        <Text variant="small" muted>
          {noticeUnitsText(doc)}
        </Text>
      ) : null}
      {doc.results.length > 0 ? (
        <Section title="Results against design limits">
          <DataTable<Result>
            label="Results against design limits"
            rows={doc.results}
            rowKey={(r) => r.label}
            columns={[
              { key: 'label', title: 'Value', render: (r) => r.label, flex: 2 },
              { key: 'value', title: 'Result', render: (r) => r.value, numeric: true },
              { key: 'limit', title: 'Limit', render: (r) => r.limit, numeric: true },
              {
                key: 'ratio',
                title: 'Share of limit',
                render: (r) => formatRatio(r.ratio),
                numeric: true,
              },
              { key: 'status', title: 'Status', render: (r) => <EnvelopeMark status={r.status} compact /> },
            ]}
          />
        </Section>
      ) : null}

      {doc.loadSummary.length > 0 ? (
        <Section title="Load summary">
          <DataTable<Load>
            label="Peak pivot loads over one ride cycle"
            rows={doc.loadSummary}
            rowKey={(l) => l.pivot}
            columns={[
              { key: 'pivot', title: 'Pivot', render: (l) => l.pivot, flex: 2 },
              { key: 'peak', title: 'Peak force', render: (l) => l.peakForce, numeric: true },
              { key: 'limit', title: 'Limit', render: (l) => l.limit ?? 'None set', numeric: true },
            ]}
          />
        </Section>
      ) : null}
    </>
  );
}

/** The ride's pivot life in the words frozen into the notice, with its assumptions and standards. */
function PivotLifeAsIssued({ life }: { life: NonNullable<NoticeDocument['pivotLife']> }) {
  return (
    <Section title={`Pivot life as of ${formatDate(life.asOf)}`}>
      <Text variant="small" muted>
        {life.basis} {life.log}
      </Text>
      {life.pivots.map((p) => (
        <View key={p.name} style={styles.lifePivot}>
          <Text variant="heading">{p.name}</Text>
          {p.lines.map((line) => (
            <Text key={line} variant="small">
              • {line}
            </Text>
          ))}
        </View>
      ))}
      {[...life.assumptions, ...life.standards].map((a) => (
        <Text key={a} variant="small" muted>
          {a}
        </Text>
      ))}
    </Section>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <View style={styles.section}>
      <Text variant="label" muted role="heading" aria-level={2}>
        {title.toUpperCase()}
      </Text>
      {children}
    </View>
  );
}

function Facts({ children }: { children: React.ReactNode }) {
  return <View style={styles.facts}>{children}</View>;
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text variant="small" muted>
        {label}
      </Text>
      <Text>{value}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  lifePivot: { gap: 2 },
  card: { gap: space.lg },
  top: { gap: space.md, paddingBottom: space.md, borderBottomWidth: 2, borderBottomColor: colors.base },
  topWide: { flexDirection: 'row', alignItems: 'flex-start' },
  refWide: { alignItems: 'flex-end' },
  grow: { flex: 1, minWidth: 0 },
  section: { gap: space.sm },
  facts: { flexDirection: 'row', flexWrap: 'wrap', rowGap: space.sm, columnGap: space.lg },
  fact: { flexBasis: 200, flexGrow: 1, gap: 2 },
  statusRow: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.md },
  findings: { gap: space.sm },
  finding: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  findingHead: { flexDirection: 'row', alignItems: 'center', flexWrap: 'wrap', gap: space.sm },
  printed: { gap: space.xs, padding: space.md, borderRadius: radius.sm, backgroundColor: colors.surfaceSunk },
});
