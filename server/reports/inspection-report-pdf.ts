/**
 * The inspection report as a PDF: the inspector's own copy of what they recorded (checklist, readings with
 * method and instrument, photos, declaration) with the server's load check and the review so far. Laid out
 * with pdfkit's own text flow and tables (a report is read top to bottom; it needs no fixed grid like the
 * notice), in the shipped IBM Plex fonts. Deterministic: the PDF's dates and id come from the record.
 */
import { CAUTION_FULL } from '@/lib/caution-text';
import { colors as C } from '@/lib/colors';
import { formatWhen } from '@/lib/dates';
import { checkResultVocabulary } from '@/lib/vocabulary';
import type { ChecklistAnswer, Reading } from '@/features/records/schema';
import { measuredWithWords } from '@/features/instruments/schema';
import { ENVELOPE_STATUS_LABEL } from '@/features/loads/engine/envelope';
import {
  formatEnvelopeItem,
  formatRatio,
  formatValue,
  measuredSources,
  sortByConcern,
} from '@/features/loads/format';
import { governingText } from '@/features/loads/load-cases';
import { jointModelText, modelsNotRecorded, periodCheckText } from '@/features/records/analysis-schema';
import { inspectionTypeLabel } from '@/features/registry/schema';
import {
  formatMeasurement,
  formatReading,
  formatSpread,
  reviewStateLabel,
} from '@/features/review/review-format';
import { readingKindLabel } from '@/features/records/schema';
import { severityInfo } from '@/features/notices/finding-schema';
import { rideClassLabel, type RideClass } from '@/features/rides/schema';
import { orNot } from '@/server/notices/words';
import { startPdf } from '@/server/pdf/document';
import type { InspectionReport } from '@/server/reports/inspection-report';
import { fatigueTable, pivotLoadsTable } from '@/server/reports/inspection-report-loads';
import { FATIGUE_BASIS } from '@/features/fatigue';
import { RANGES_NOTE } from '@/features/loads';

type ReportPaper = 'A4' | 'LETTER';

const MARGIN = 50;

/** A reading's value as recorded: the inspector's own digits when the record kept them (one rule). */
function readingValue(r: Reading): string {
  return formatReading(r, 'si');
}

function checklistValue(a: ChecklistAnswer): string {
  if (!a.measurement) return '';
  return formatMeasurement(a.measurement);
}

type Doc = PDFKit.PDFDocument;

function heading(doc: Doc, title: string) {
  // Keep a heading with at least a few lines of what follows it.
  if (doc.y > doc.page.height - MARGIN - 90) doc.addPage();
  doc.moveDown(0.8).font('bold').fontSize(12.5).fillColor(C.base).text(title, MARGIN);
  doc.moveDown(0.3).font('regular').fontSize(9.5).fillColor(C.text);
}

const LABEL_W = 150;

/** Label and value side by side; a long value wraps in its own column. */
function pairs(doc: Doc, rows: [string, string][]) {
  const valueW = doc.page.width - 2 * MARGIN - LABEL_W;
  for (const [label, value] of rows) {
    doc.font('regular').fontSize(9.5);
    if (doc.y + doc.heightOfString(value, { width: valueW }) > doc.page.height - MARGIN) doc.addPage();
    const y = doc.y;
    doc
      .font('semibold')
      .fontSize(7.5)
      .fillColor(C.textMuted)
      .text(label.toUpperCase(), MARGIN, y + 1.5, {
        width: LABEL_W - 8,
      });
    const labelBottom = doc.y;
    doc
      .font('regular')
      .fontSize(9.5)
      .fillColor(C.text)
      .text(value, MARGIN + LABEL_W, y, { width: valueW });
    doc.y = Math.max(doc.y, labelBottom) + 2;
  }
  doc.x = MARGIN;
}

function table(doc: Doc, head: string[], rows: string[][], widths: (number | string)[]) {
  if (rows.length === 0) {
    doc.font('regular').fontSize(9.5).fillColor(C.textMuted).text('None recorded.', MARGIN);
    return;
  }
  doc.font('regular').fontSize(8.6).fillColor(C.text);
  doc.table({
    position: { x: MARGIN },
    maxWidth: doc.page.width - 2 * MARGIN,
    columnStyles: widths,
    defaultStyle: { border: 0.5, borderColor: C.border, padding: 3 },
    rowStyles: (i) => (i === 0 ? { backgroundColor: C.surfaceSunk } : undefined),
    data: [head.map((text) => ({ text, font: { src: 'semibold' }, type: 'TH' as const })), ...rows],
  });
  doc.x = MARGIN;
}

function identity(doc: Doc, r: InspectionReport) {
  const i = r.inspection;
  heading(doc, 'Ride');
  pairs(doc, [
    ['Ride', r.ride.name],
    ['Class', rideClassLabel[r.ride.rideClass as RideClass] ?? r.ride.rideClass],
    ['Maker, model, serial', [r.ride.maker, r.ride.model, r.ride.serial].map((v) => orNot(v)).join(' · ')],
    ['Site', orNot(r.ride.siteName)],
    ['Operator', r.ride.operatorName],
  ]);
  heading(doc, 'Inspection');
  pairs(doc, [
    ['Type', inspectionTypeLabel[i.type] ?? i.type],
    ['Inspector', i.inspectorName],
    ['Started', formatWhen(i.startedAt, r.ride.siteTimeZone)],
    ['Submitted on the phone', formatWhen(i.submittedAt, r.ride.siteTimeZone)],
    ['Received by the server', formatWhen(i.receivedAt, r.ride.siteTimeZone)],
    ['Design data', i.designVersion ? `Version ${i.designVersion}` : 'None on record'],
    ['Review', reviewStateLabel[i.reviewState]],
    ...(i.reviewNote ? [['Reviewer’s note', i.reviewNote] as [string, string]] : []),
    ...(i.amendsId ? [['Amends', i.amendsId] as [string, string]] : []),
    ['Record', i.id],
  ]);
}

function declaration(doc: Doc, r: InspectionReport) {
  heading(doc, 'Inspector’s declaration');
  const d = (
    r.inspection.record as {
      declaration?: { text: string; declaredAt: string; declaredByName: string };
    }
  ).declaration;
  if (!d) {
    doc.text('No declaration is on this record (it was submitted before declarations were asked for).');
    return;
  }
  doc.font('regular').fontSize(9.5).fillColor(C.text).text(`“${d.text}”`, MARGIN);
  doc
    .moveDown(0.3)
    .fillColor(C.textMuted)
    .text(`Declared by ${d.declaredByName} on ${formatWhen(d.declaredAt, r.ride.siteTimeZone)}.`);
}

function checklist(doc: Doc, r: InspectionReport) {
  heading(doc, 'Checklist');
  const answers = r.inspection.record.checklist;
  const rows = answers.map((a) => {
    const reason = (a as { overLimitReason?: string }).overLimitReason;
    const note = [a.note, reason ? `Over its limit, passed because: ${reason}` : null]
      .filter(Boolean)
      .join(' · ');
    return [
      a.area,
      a.text,
      a.result ? checkResultVocabulary[a.result].label : 'Not answered',
      checklistValue(a),
      note,
    ];
  });
  table(doc, ['Area', 'Item', 'Result', 'Measured', 'Note'], rows, [70, '*', 58, 70, 120]);
}

function readings(doc: Doc, r: InspectionReport) {
  heading(doc, 'Readings');
  const list = r.inspection.record.readings;
  const rows = list.map((x) => {
    const p = (x as Reading & { plausibility?: { ratio: number; note?: string } }).plausibility;
    const notes = [
      formatSpread(x, 'si'),
      p ? `Confirmed by the inspector at ${formatRatio(p.ratio)} of the design motion` : null,
      p?.note ?? null,
      x.note ?? null,
    ].filter(Boolean);
    return [
      `${x.label || readingKindLabel[x.kind]}${x.joint === null ? '' : ` (P${x.joint + 1})`}`,
      readingValue(x),
      measuredWithWords(x),
      formatWhen(x.takenAt, r.ride.siteTimeZone),
      notes.join(' · '),
    ];
  });
  table(doc, ['Reading', 'Value', 'Method and instrument', 'Taken', 'Notes'], rows, ['*', 70, 120, 92, 110]);
}

function photos(doc: Doc, r: InspectionReport) {
  heading(doc, 'Photos');
  const rows = r.inspection.photos.map((p) => [
    p.caption || 'No caption',
    p.joint === null ? '' : `P${p.joint + 1}`,
    formatWhen(p.takenAt, r.ride.siteTimeZone),
    `${p.sha256.slice(0, 16)}…`,
    p.received ? 'Received' : 'Not yet received',
  ]);
  table(doc, ['Caption', 'Pivot', 'Taken', 'SHA-256', 'Copy on server'], rows, ['*', 40, 92, 100, 70]);
}

function loadCheck(doc: Doc, r: InspectionReport) {
  heading(doc, 'Load check (computed by the server)');
  const a = r.inspection.analysis;
  if (!a) {
    doc.text(r.inspection.analysisNote ?? 'Not analysed yet.', MARGIN);
    return;
  }
  doc
    .text(
      `Engine ${a.engineVersion}, design data version ${a.designVersion}, ${a.samples} samples over ` +
        `${formatValue(a.durationS, 'time', 'si')}. Overall: ${a.status ? ENVELOPE_STATUS_LABEL[a.status] : 'no envelope defined'}.`,
      MARGIN,
    )
    .moveDown(0.4);
  loadCheckBasis(doc, a);
  // The same strings as the review desk and the notices: typed values as typed, never across the limit.
  const sources = measuredSources(r.inspection.record);
  const rows = sortByConcern(a.envelope).map((e) => {
    const shown = formatEnvelopeItem(e, 'si', sources.get(e.id));
    return [e.label, shown.value, shown.limit, shown.ratio, ENVELOPE_STATUS_LABEL[e.status]];
  });
  table(doc, ['Quantity', 'Value', 'Limit', 'Of limit', 'Status'], rows, ['*', 80, 90, 55, 65]);
  const loads = pivotLoadsTable(a, 'si');
  doc.moveDown(0.6);
  table(doc, loads.head, loads.rows, loads.widths);
  doc.moveDown(0.3).fillColor(C.textMuted).text(RANGES_NOTE, MARGIN).fillColor(C.text);
  const fatigue = fatigueTable(a, 'si');
  if (fatigue) {
    heading(doc, 'Fatigue of the pivots’ details');
    table(doc, fatigue.head, fatigue.rows, fatigue.widths);
    doc.moveDown(0.3).fillColor(C.textMuted).text(FATIGUE_BASIS, MARGIN).fillColor(C.text);
  }
  if (a.differences.length > 0) {
    doc
      .moveDown(0.4)
      .fillColor(C.textMuted)
      .text(`Differences from the phone’s preview: ${a.differences.join('; ')}`);
  }
}

/** How the check was made: each joint's model, free-swing periods, the governing case, the warnings. */
function loadCheckBasis(doc: Doc, a: NonNullable<InspectionReport['inspection']['analysis']>) {
  const lines = [
    a.models?.length
      ? `Models: ${a.models.map((m) => `P${m.joint + 1} ${m.name}: ${jointModelText(m)}`).join('; ')}.`
      : `${modelsNotRecorded(a.engineVersion)}.`,
    ...(a.periodChecks ?? []).map((p) => `Free swing period, ${p.name}: ${periodCheckText(p)}.`),
    governingText(a.governingCase ?? null, a.envelope),
    ...(a.warnings ?? []).filter((w) => w.level === 'warning').map((w) => `Check: ${w.message}`),
  ].filter(Boolean);
  doc.fillColor(C.textMuted);
  for (const line of lines) doc.text(line, MARGIN);
  doc.fillColor(C.text).moveDown(0.4);
}

function findingsSection(doc: Doc, r: InspectionReport) {
  heading(doc, 'Findings');
  const rows = r.inspection.findings.map((f) => [
    String((f as { rideNumber?: number | null }).rideNumber ?? f.number),
    severityInfo[f.severity].label,
    f.description,
    orNot(f.requiredAction),
    f.dueOn ?? '',
  ]);
  table(doc, ['No.', 'Severity', 'Finding', 'Required action', 'Due'], rows, [30, 80, '*', 130, 62]);
}

function footers(doc: Doc, r: InspectionReport) {
  const range = doc.bufferedPageRange();
  for (let p = range.start; p < range.start + range.count; p++) {
    doc.switchToPage(p);
    // Writing below the bottom margin would make pdfkit start a new page; the footer lives there.
    doc.page.margins.bottom = 0;
    const y = doc.page.height - MARGIN + 14;
    doc
      .font('regular')
      .fontSize(7.5)
      .fillColor(C.textMuted)
      .text(
        `Pivotwatch inspection report · ${r.ride.name} · copy for ${r.printedFor}, ${formatWhen(r.printedAt, r.ride.siteTimeZone)} · page ${p - range.start + 1} of ${range.count}`,
        MARGIN,
        y,
        { width: doc.page.width - 2 * MARGIN, lineBreak: false },
      );
  }
}

/** Renders the report. */
export function renderInspectionReportPdf(r: InspectionReport, paper: ReportPaper): Promise<Buffer> {
  const i = r.inspection;
  const { doc, finished } = startPdf({
    size: paper,
    margins: MARGIN,
    title: `Inspection report — ${r.ride.name}`,
    author: i.inspectorName,
    subject: `${inspectionTypeLabel[i.type] ?? i.type} inspection of ${r.ride.name}`,
    createdAt: i.submittedAt,
  });

  doc.font('bold').fontSize(18).fillColor(C.base).text('Inspection report', MARGIN, MARGIN);
  doc
    .font('semibold')
    .fontSize(12)
    .fillColor(C.text)
    .text(`${r.ride.name} — ${formatWhen(i.submittedAt, r.ride.siteTimeZone)}`);
  identity(doc, r);
  declaration(doc, r);
  checklist(doc, r);
  readings(doc, r);
  photos(doc, r);
  loadCheck(doc, r);
  findingsSection(doc, r);
  if (i.record.notes) {
    heading(doc, 'Inspector’s notes');
    doc.text(i.record.notes, MARGIN);
  }
  heading(doc, 'Caution');
  doc.font('regular').fontSize(8.6).fillColor(C.text).text(CAUTION_FULL, MARGIN);

  footers(doc, r);
  doc.flushPages();
  doc.end();
  return finished;
}
