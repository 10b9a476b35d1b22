/**
 * The notice's place in the ride's record chain, printed on its PDF: the entry hash the server
 * countersigned when the notice was issued, and a QR code (drawn as vector squares from the `qrcode`
 * package's matrix) that opens the ride's verification in the app.
 */
import { create as createQr } from 'qrcode';

import { colors as C } from '@/lib/colors';
import type { NoticeChainMark } from '@/server/ledger/notice-mark';
import { draw, heading, lineHeight, measure, S, type Layout } from '@/server/pdf/layout';

const QR_SIZE = 78;
/** The quiet zone around a QR code, in modules (ISO/IEC 18004 asks for 4). */
const QUIET = 4;

/** The QR code's dark modules as rows of booleans, without the quiet zone (what `drawQr` draws). */
export function qrModules(text: string): boolean[][] {
  const { modules } = createQr(text, { errorCorrectionLevel: 'M' });
  return Array.from({ length: modules.size }, (_, r) =>
    Array.from({ length: modules.size }, (_, c) => Boolean(modules.get(r, c))),
  );
}

function drawQr(l: Layout, text: string, x: number, y: number, size: number) {
  const rows = qrModules(text);
  const cell = size / (rows.length + 2 * QUIET);
  l.doc.rect(x, y, size, size).fill('#ffffff');
  rows.forEach((row, r) =>
    row.forEach((dark, c) => {
      if (dark) l.doc.rect(x + (c + QUIET) * cell, y + (r + QUIET) * cell, cell, cell);
    }),
  );
  l.doc.fill('#000000');
}

export function chainSection(l: Layout, mark: NoticeChainMark) {
  const textX = l.left + QR_SIZE + 14;
  const textW = l.right - textX;
  const intro =
    'This notice is an entry in the ride’s tamper-evident record chain. Scan the code, or open the address ' +
    'below, to check that the chain is intact.';
  const h = Math.max(
    QR_SIZE,
    measure(l, intro, S.small, textW) + 8 + lineHeight(l, S.label) * 2 + lineHeight(l, S.figure) * 3,
  );
  heading(l, 'Record chain', h);
  const y = l.y;
  drawQr(l, mark.verifyUrl, l.left, y, QR_SIZE);
  let ty = y;
  draw(l, intro, S.small, textX, ty, textW);
  ty += measure(l, intro, S.small, textW) + 6;
  draw(l, 'ENTRY HASH (SHA-256)', S.label, textX, ty, textW);
  ty += lineHeight(l, S.label);
  draw(l, mark.entryHash, { ...S.figure, size: 7.4 }, textX, ty, textW);
  ty += lineHeight(l, S.figure) + 2;
  draw(l, 'VERIFY AT', S.label, textX, ty, textW);
  ty += lineHeight(l, S.label);
  draw(l, mark.verifyUrl, { ...S.small, color: C.text }, textX, ty, textW);
  ty += measure(l, mark.verifyUrl, S.small, textW);
  l.y = Math.max(y + QR_SIZE, ty);
}
