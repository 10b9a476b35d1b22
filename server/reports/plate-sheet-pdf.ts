/**
 * A sheet of plates as a PDF, on A4 or US Letter: a grid of labels, each with its QR code (the `qrcode`
 * package's module matrix, drawn as squares, with the four-module quiet zone ISO/IEC 18004 asks for), the
 * ride's name, the pivot (or "Whole ride") and the site, in the shipped fonts. Cut lines are drawn light
 * and dashed between the labels.
 */
import QRCode from 'qrcode';

import { colors as C } from '@/lib/colors';
import { startPdf } from '@/server/pdf/document';
import type { Plate, PlateSheet } from '@/server/reports/plate-sheet';

export type PlatePaper = 'A4' | 'LETTER';

const MARGIN = 36;
const HEADER = 26;
const COLUMNS = 3;
const ROWS = 4;
/** Modules of white kept around the code (ISO/IEC 18004's quiet zone). */
const QUIET = 4;
const QR_SIDE = 112;

/**
 * The code's modules for an address: size × size, true where a module is dark. Medium error correction
 * (about 15 % of the code may be lost to dirt or a scratch and it still reads).
 */
export function plateModules(url: string): { size: number; dark: (row: number, col: number) => boolean } {
  const { modules } = QRCode.create(url, { errorCorrectionLevel: 'M' });
  return { size: modules.size, dark: (row, col) => modules.get(row, col) === 1 };
}

type Doc = PDFKit.PDFDocument;

function drawCode(doc: Doc, url: string, x: number, y: number, side: number) {
  const m = plateModules(url);
  const unit = side / (m.size + 2 * QUIET);
  doc.rect(x, y, side, side).fill('#ffffff');
  for (let row = 0; row < m.size; row++)
    for (let col = 0; col < m.size; col++)
      if (m.dark(row, col)) doc.rect(x + (QUIET + col) * unit, y + (QUIET + row) * unit, unit, unit);
  doc.fill('#000000');
}

function drawLabel(doc: Doc, plate: Plate, x: number, y: number, w: number) {
  const inner = w - 16;
  drawCode(doc, plate.url, x + (w - QR_SIDE) / 2, y + 8, QR_SIDE);
  let ty = y + 8 + QR_SIDE + 4;
  const line = (text: string, font: 'bold' | 'regular' | 'semibold', size: number, color: string) => {
    doc.font(font).fontSize(size).fillColor(color);
    const opts = {
      width: inner,
      align: 'center' as const,
      height: doc.currentLineHeight(true) * 2,
      ellipsis: true,
    };
    doc.text(text, x + 8, ty, opts);
    ty += Math.min(doc.heightOfString(text, { width: inner }), opts.height) + 1;
  };
  line(plate.rideName, 'bold', 11, C.base);
  line(plate.pivot ?? 'Whole ride', 'semibold', 9.5, C.text);
  line(plate.siteName ?? 'No site', 'regular', 8, C.textMuted);
}

/** The sheet: labels left to right, top to bottom; a running line on each page says what it is. */
export function renderPlateSheetPdf(sheet: PlateSheet, paper: PlatePaper): Promise<Buffer> {
  const { doc, finished } = startPdf({
    size: paper,
    margins: MARGIN,
    autoFirstPage: false,
    title: 'Ride and pivot plates',
    author: 'Pivotwatch',
    subject: `QR plates for ${sheet.rideCount} ride${sheet.rideCount === 1 ? '' : 's'}`,
    createdAt: sheet.printedAt,
  });
  const perPage = COLUMNS * ROWS;
  const pages = Math.max(1, Math.ceil(sheet.plates.length / perPage));
  for (let page = 0; page < pages; page++) {
    doc.addPage();
    const pageW = doc.page.width;
    const pageH = doc.page.height;
    const cellW = (pageW - 2 * MARGIN) / COLUMNS;
    const cellH = (pageH - 2 * MARGIN - HEADER) / ROWS;
    doc
      .font('semibold')
      .fontSize(8)
      .fillColor(C.textMuted)
      .text(
        `Pivotwatch · ride and pivot plates · page ${page + 1} of ${pages} · scan with the Scan action on Today`,
        MARGIN,
        MARGIN,
        { width: pageW - 2 * MARGIN, lineBreak: false },
      );
    const top = MARGIN + HEADER;
    const onPage = sheet.plates.slice(page * perPage, (page + 1) * perPage);
    if (onPage.length === 0)
      doc.font('regular').fontSize(10).fillColor(C.text).text('No rides in the register yet.', MARGIN, top);
    onPage.forEach((plate, i) => {
      const x = MARGIN + (i % COLUMNS) * cellW;
      const y = top + Math.floor(i / COLUMNS) * cellH;
      doc.save().lineWidth(0.4).dash(3, { space: 3 }).rect(x, y, cellW, cellH).stroke(C.border).restore();
      drawLabel(doc, plate, x, y, cellW);
    });
  }
  doc.end();
  return finished;
}
