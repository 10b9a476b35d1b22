/**
 * The notice's signature block: the issuer's side filled in, the operator's side left as lines to sign on
 * paper (the app records the acknowledgement itself).
 */
import { colors as C } from '@/lib/colors';
import { formatWhen } from '@/lib/dates';
import type { NoticeDocument } from '@/features/notices/schema';
import {
  draw,
  drawPairs,
  heading,
  headingHeight,
  LABEL_W,
  measure,
  pairsHeight,
  S,
  type Layout,
  type Pair,
} from '@/server/pdf/layout';

function signatureParts(l: Layout, n: NoticeDocument) {
  const gap = 18;
  const colW = (l.width - gap) / 2;
  const pad = 9;
  const sig = n.signature;
  const leftPairs: Pair[] = [
    ['Name', sig.name, S.bodyStrong],
    ['Role', sig.role],
    ['Date', formatWhen(sig.signedAt, n.timeZone)],
  ];
  const rows = ['Name', 'Role', 'Date'];
  const introL = `Issued for ${n.issuer.name}`;
  const introR = `Received for ${n.operator.name}`;
  const introH = Math.max(
    measure(l, introL, S.small, colW - 2 * pad),
    measure(l, introR, S.small, colW - 2 * pad),
  );
  const lineRowH = 19;
  const pairsH = Math.max(pairsHeight(l, leftPairs, colW - 2 * pad), rows.length * lineRowH);
  const h = pad + introH + 6 + pairsH + 24 + pad;
  return { gap, colW, pad, leftPairs, rows, introL, introR, introH, lineRowH, h };
}

/** The signature block with its heading, as tall as it will be drawn. */
export const signatureHeight = (l: Layout, n: NoticeDocument) => headingHeight(l) + signatureParts(l, n).h;

export function signatureBlock(l: Layout, n: NoticeDocument) {
  const { gap, colW, pad, leftPairs, rows, introL, introR, introH, lineRowH, h } = signatureParts(l, n);
  heading(l, 'Signatures', h);
  const { doc } = l;
  const y = l.y;
  for (const x of [l.left, l.left + colW + gap])
    doc.roundedRect(x, y, colW, h, 4).lineWidth(0.8).stroke(C.border);

  // Issuer's side.
  let lx = l.left + pad;
  draw(l, introL, S.small, lx, y + pad, colW - 2 * pad);
  const py = y + pad + introH + 6;
  drawPairs(l, leftPairs, lx, py, colW - 2 * pad);
  const lineY = y + h - pad - 12;
  doc
    .moveTo(lx + LABEL_W, lineY)
    .lineTo(l.left + colW - pad, lineY)
    .lineWidth(0.8)
    .stroke(C.text);
  draw(l, 'SIGNATURE', S.label, lx, lineY - 8, LABEL_W - 8);

  // Operator's side: blank lines to fill in on paper; the app records the acknowledgement itself.
  lx = l.left + colW + gap + pad;
  draw(l, introR, S.small, lx, y + pad, colW - 2 * pad);
  rows.forEach((label, i) => {
    const ry = py + i * lineRowH;
    draw(l, label.toUpperCase(), S.label, lx, ry + 1.5, LABEL_W - 8);
    doc
      .moveTo(lx + LABEL_W, ry + 12)
      .lineTo(l.right - pad, ry + 12)
      .lineWidth(0.5)
      .stroke(C.border);
  });
  doc
    .moveTo(lx + LABEL_W, lineY)
    .lineTo(l.right - pad, lineY)
    .lineWidth(0.8)
    .stroke(C.text);
  draw(l, 'SIGNATURE', S.label, lx, lineY - 8, LABEL_W - 8);
  l.y = y + h;
}
