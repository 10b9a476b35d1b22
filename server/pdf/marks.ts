/**
 * The vocabulary's marks on paper: the same drawing the app shows (`lib/mark-icons.ts`, painted in the
 * mark's colours from `lib/vocabulary.ts`), so a state printed in a notice looks as it does on screen.
 * Paper has no badge behind the mark, so a solid mark (white on its colour) prints the other way round
 * (`paperMark`).
 */
import { colors } from '@/lib/colors';
import { ICON_BOX, iconParts, type IconPart, type Paint } from '@/lib/mark-icons';
import { type Mark, paperMark } from '@/lib/vocabulary';
import { setStyle, textWidth, type Doc, type Layout, type TextStyle } from '@/server/pdf/layout';

/** A mark's colours as printed: `fg` for its shape and words, `bg` for what its cut-outs show. */
export function markInk(mark: Mark): { fg: string; bg: string } {
  const p = paperMark(mark);
  return { fg: colors[p.fg], bg: colors[p.bg] };
}

function drawPart(doc: Doc, part: IconPart, paint: (p: Paint) => string) {
  switch (part.kind) {
    case 'circle':
      doc.circle(part.cx, part.cy, part.r);
      break;
    case 'rect':
      if (part.rx) doc.roundedRect(part.x, part.y, part.width, part.height, part.rx);
      else doc.rect(part.x, part.y, part.width, part.height);
      break;
    case 'path':
      doc.path(part.d);
      break;
    case 'line':
      doc.moveTo(part.x1, part.y1).lineTo(part.x2, part.y2);
      break;
  }
  if (part.stroke) {
    doc.lineWidth(part.strokeWidth ?? 1);
    doc.lineCap(part.lineCap ?? 'butt');
    doc.lineJoin(part.lineJoin ?? 'miter');
  }
  const fill = 'fill' in part && part.fill ? paint(part.fill) : null;
  const stroke = part.stroke ? paint(part.stroke) : null;
  if (fill && stroke) doc.fillAndStroke(fill, stroke);
  else if (fill) doc.fill(fill);
  else if (stroke) doc.stroke(stroke);
}

/** Draws a mark's icon `size` points wide, its left edge at `x` and its middle at `cy`. */
export function drawMarkIcon(doc: Doc, mark: Mark, x: number, cy: number, size: number) {
  const ink = markInk(mark);
  const paint = (p: Paint) => (p === 'white' ? colors.surface : ink[p]);
  doc.save();
  doc.translate(x, cy - size / 2).scale(size / ICON_BOX);
  for (const part of iconParts(mark.icon)) drawPart(doc, part, paint);
  doc.restore();
}

/** A mark followed by its word, both in the mark's colour; returns the width used. */
export function drawMarked(l: Layout, mark: Mark, word: string, s: TextStyle, x: number, y: number): number {
  const size = s.size * 0.95;
  const color = markInk(mark).fg;
  const lh = l.doc.font(s.font).fontSize(s.size).currentLineHeight(false);
  drawMarkIcon(l.doc, mark, x, y + lh / 2, size);
  const tx = x + size + s.size * 0.45;
  setStyle(l, { ...s, color });
  l.doc.text(word, tx, y, { lineBreak: false, characterSpacing: s.spacing ?? 0 });
  return tx - x + textWidth(l, word, s);
}
