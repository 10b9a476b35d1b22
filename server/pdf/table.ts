/**
 * Tables for the PDF layout engine: columns sized by share of the width, rows that break between pages
 * with the header row repeated, and cells that may carry a vocabulary mark before their words.
 */
import { colors as C } from '@/lib/colors';
import type { Mark } from '@/lib/vocabulary';
import {
  draw,
  ensure,
  lineHeight,
  S,
  withHook,
  measure,
  type Layout,
  type TextStyle,
} from '@/server/pdf/layout';
import { drawMarkIcon } from '@/server/pdf/marks';

type Cell = { text: string; style?: TextStyle; mark?: Mark };
type Column<R> = { title: string; share: number; align?: 'left' | 'right'; cell: (row: R) => Cell };

/** Room for a table's header row and its first two rows, kept with the heading above the table. */
export const TABLE_START = 80;

const CELL_PAD_X = 5;
const CELL_PAD_Y = 4;

function cellHeight(l: Layout, c: Cell, width: number): number {
  const s = c.style ?? S.cell;
  const markW = c.mark ? s.size + 4 : 0;
  return measure(l, c.text, s, width - 2 * CELL_PAD_X - markW) + 2 * CELL_PAD_Y;
}

/** A table that breaks between rows and repeats its header row on every page it runs onto. */
export function table<R>(
  l: Layout,
  columns: Column<R>[],
  rows: R[],
  opts: { keepAbove?: number; continued?: string } = {},
) {
  const total = columns.reduce((s, c) => s + c.share, 0);
  const widths = columns.map((c) => (l.width * c.share) / total);
  const xs = widths.map((_, i) => l.left + widths.slice(0, i).reduce((s, w) => s + w, 0));
  const headCells: Cell[] = columns.map((c) => ({ text: c.title.toUpperCase(), style: S.cellHead }));
  const headH = Math.max(...headCells.map((c, i) => cellHeight(l, c, widths[i])));

  const drawHead = () => {
    l.doc.rect(l.left, l.y, l.width, headH).fill(C.surfaceSunk);
    headCells.forEach((c, i) => {
      const s = c.style ?? S.cell;
      draw(
        l,
        c.text,
        { ...s, spacing: 0.4 },
        xs[i] + CELL_PAD_X,
        l.y + CELL_PAD_Y,
        widths[i] - 2 * CELL_PAD_X,
        columns[i].align ?? 'left',
      );
    });
    l.y += headH;
  };

  const cellsOf = rows.map((r) => columns.map((c) => c.cell(r)));
  const heights = cellsOf.map((cells) => Math.max(...cells.map((c, i) => cellHeight(l, c, widths[i]))));
  // Keep the header with the first two rows (and whatever the caller keeps above the table).
  ensure(l, (opts.keepAbove ?? 0) + headH + (heights[0] ?? 0) + (heights[1] ?? 0));
  drawHead();
  const continued = () => {
    if (opts.continued) {
      draw(l, `${opts.continued}, continued`, { ...S.small, font: 'semibold' }, l.left, l.y, l.width);
      l.y += lineHeight(l, S.small) + 3;
    }
    drawHead();
  };
  withHook(l, continued, () => {
    cellsOf.forEach((cells, r) => {
      ensure(l, heights[r]);
      const y = l.y;
      if (r % 2 === 1) l.doc.rect(l.left, y, l.width, heights[r]).fill('#F6F8F9');
      cells.forEach((c, i) => {
        const s = c.style ?? S.cell;
        let x = xs[i] + CELL_PAD_X;
        let w = widths[i] - 2 * CELL_PAD_X;
        if (c.mark) {
          const lh = l.doc.font(s.font).fontSize(s.size).currentLineHeight(false);
          drawMarkIcon(l.doc, c.mark, x, y + CELL_PAD_Y + lh / 2, s.size * 0.95);
          x += s.size + 4;
          w -= s.size + 4;
        }
        draw(l, c.text, s, x, y + CELL_PAD_Y, w, columns[i].align ?? 'left');
      });
      l.doc
        .moveTo(l.left, y + heights[r])
        .lineTo(l.right, y + heights[r])
        .lineWidth(0.5)
        .stroke(C.border);
      l.y = y + heights[r];
    });
  });
}
