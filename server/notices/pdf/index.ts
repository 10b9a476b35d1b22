/**
 * The notice as a PDF: the frozen `NoticeDocument` laid out on A4 or US Letter with the shipped IBM Plex
 * fonts (nothing else is embedded). The layout is done with our own engine (`server/pdf/layout.ts`)
 * rather than pdfkit's automatic page flow, so that a table breaks between rows and repeats its header, a
 * finding that runs onto the next page says so, and the footer ("page n of m") can be written once every
 * page exists. Marks are the app's (`server/pdf/marks.ts`).
 *
 * Output is deterministic for a given document: the PDF's creation date and file id come from
 * `issuedAt`, so the same notice renders to the same bytes.
 */
import type { NoticeDocument } from '@/features/notices/schema';
import {
  drawFirstHeader,
  drawFooters,
  runningHeader,
  titleBlock,
  titleOf,
} from '@/server/notices/pdf/furniture';
import { findingsSection, loadPhotos, severityLegend, type PhotoLoader } from '@/server/notices/pdf/findings';
import {
  inspectionPairs,
  loadSection,
  paragraphSection,
  resultsSection,
  ridePairs,
  statusBoxes,
} from '@/server/notices/pdf/sections';
import { pivotLifeSection } from '@/server/notices/pdf/pivot-life';
import { chainSection } from '@/server/notices/pdf/chain-mark';
import type { NoticeChainMark } from '@/server/ledger/notice-mark';
import { signatureBlock, signatureHeight } from '@/server/notices/pdf/signature';
import { startPdf } from '@/server/pdf/document';
import { flowText, heading, pairColumns, S, type Layout } from '@/server/pdf/layout';

export type { PhotoLoader };
export type NoticePdfOptions = {
  pageSize: 'A4' | 'LETTER';
  loadPhoto: PhotoLoader;
  /** The notice's record-chain entry and verification address; null prints no chain section. */
  chain?: NoticeChainMark | null;
};

const MARGIN_X = 50;
const FOOTER_SPACE = 60;

/** Renders a notice to PDF bytes. Photos that cannot be loaded print as "photo not available". */
export async function renderNoticePdf(n: NoticeDocument, opts: NoticePdfOptions): Promise<Buffer> {
  const loaded = await loadPhotos(n, opts.loadPhoto);
  const title = titleOf(n);
  const { doc, finished } = startPdf({
    size: opts.pageSize,
    margins: 0,
    autoFirstPage: false,
    title: `${title} ${n.reference} — ${n.ride.name}`,
    author: n.issuer.name,
    subject: `${title} for ${n.operator.name}`,
    createdAt: n.issuedAt,
  });

  doc.addPage();
  const l: Layout = {
    doc,
    pageW: doc.page.width,
    pageH: doc.page.height,
    left: MARGIN_X,
    width: doc.page.width - 2 * MARGIN_X,
    right: doc.page.width - MARGIN_X,
    bottom: doc.page.height - FOOTER_SPACE,
    y: 0,
    pageStart: 0,
    hooks: [],
    runningHeader: runningHeader(n),
  };

  titleBlock(l, n, drawFirstHeader(l, n));
  l.pageStart = l.y;
  statusBoxes(l, n);

  heading(l, 'Ride, site and operator', 60);
  const rp = ridePairs(n);
  pairColumns(l, rp.left, rp.right);

  heading(l, 'Inspection', 40);
  const ip = inspectionPairs(n);
  if (ip) pairColumns(l, ip.left, ip.right);
  else
    flowText(
      l,
      'This notice records a change of the ride’s status made outside an inspection. Open findings from earlier inspections are listed below.',
      S.body,
      l.left,
      l.width,
    );

  findingsSection(l, n, loaded);
  if (n.findings.length > 0) severityLegend(l);
  // A status notice made outside an inspection has no readings or load check: leave those sections out.
  if (n.inspection || n.results.length > 0) resultsSection(l, n);
  // Before the load summary, whose caution box closes the computed parts of the notice.
  pivotLifeSection(l, n);
  loadSection(l, n, { showEmpty: n.inspection !== null });
  if (n.note) paragraphSection(l, 'Supervisor’s note', n.note);
  paragraphSection(l, 'How to appeal', n.appeal, signatureHeight(l, n));
  signatureBlock(l, n);
  if (opts.chain) chainSection(l, opts.chain);

  drawFooters(l, n);
  doc.flushPages();
  doc.end();
  return finished;
}
