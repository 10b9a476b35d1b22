/**
 * The notice's findings: a summary line of severities, one block per finding (its band, what was found,
 * the rule it breaches, the action required, its photos) and the legend of what the severities mean.
 */
import { colors as C } from '@/lib/colors';
import { formatCalendarDate } from '@/lib/dates';
import {
  findingSeverities,
  findingSeverityVocabulary,
  findingStateVocabulary,
  type FindingSeverity,
} from '@/lib/vocabulary';
import type { NoticeDocument } from '@/features/notices/schema';
import {
  draw,
  ensure,
  flowPair,
  flowText,
  heading,
  LABEL_W,
  lineHeight,
  measure,
  S,
  setStyle,
  textWidth,
  withHook,
  type Layout,
  type TextStyle,
} from '@/server/pdf/layout';
import { orNot } from '@/server/notices/words';
import { drawMarked, markInk } from '@/server/pdf/marks';
import { table, TABLE_START } from '@/server/pdf/table';

export type PhotoLoader = (sha256: string) => Promise<Buffer | null> | Buffer | null;

type LoadedPhoto = { ok: true; data: Buffer } | { ok: false };

const THUMB_W = 116;
const THUMB_H = 87;
const THUMB_GAP = 10;

const isJpeg = (b: Buffer) => b.length > 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff;
const isPng = (b: Buffer) => b.length > 8 && b.subarray(0, 8).equals(Buffer.from('89504e470d0a1a0a', 'hex'));

export async function loadPhotos(
  n: NoticeDocument,
  loadPhoto: PhotoLoader,
): Promise<Map<string, LoadedPhoto>> {
  const shas = [...new Set(n.findings.flatMap((f) => f.photos.map((p) => p.sha256)))];
  const loaded = await Promise.all(
    shas.map(async (sha): Promise<[string, LoadedPhoto]> => {
      try {
        const data = await loadPhoto(sha);
        // pdfkit embeds JPEG and PNG; anything else prints as not available rather than failing.
        if (data && (isJpeg(data) || isPng(data))) return [sha, { ok: true, data }];
      } catch {
        // A photo that cannot be read must not stop the notice: it prints as not available.
      }
      return [sha, { ok: false }];
    }),
  );
  return new Map(loaded);
}

function drawThumb(l: Layout, photo: LoadedPhoto | undefined, x: number, y: number): boolean {
  const { doc } = l;
  doc.rect(x, y, THUMB_W, THUMB_H).fill(C.surfaceSunk);
  let drawn = false;
  if (photo?.ok) {
    try {
      doc.image(photo.data, x + 3, y + 3, {
        fit: [THUMB_W - 6, THUMB_H - 6],
        align: 'center',
        valign: 'center',
      });
      drawn = true;
    } catch {
      drawn = false;
    }
  }
  if (!drawn) {
    const s: TextStyle = { ...S.small, font: 'semibold' };
    draw(l, 'Photo not available', s, x + 6, y + THUMB_H / 2 - 5, THUMB_W - 12, 'center');
  }
  doc.rect(x, y, THUMB_W, THUMB_H).lineWidth(0.6).stroke(C.border);
  return drawn;
}

function photoGrid(
  l: Layout,
  photos: NoticeDocument['findings'][number]['photos'],
  loaded: Map<string, LoadedPhoto>,
  x: number,
  width: number,
) {
  const perRow = Math.max(1, Math.floor((width + THUMB_GAP) / (THUMB_W + THUMB_GAP)));
  const capStyle: TextStyle = { ...S.small, size: 7.4, gap: 1.2 };
  const captions = photos.map((p) => {
    const ok = loaded.get(p.sha256)?.ok === true;
    const caption = p.caption.trim() || 'Photo';
    return ok ? caption : `${caption} (photo not available)`;
  });
  for (let start = 0; start < photos.length; start += perRow) {
    const row = photos.slice(start, start + perRow);
    const capH = Math.max(...row.map((_, i) => measure(l, captions[start + i], capStyle, THUMB_W)));
    const rowH = THUMB_H + 4 + capH + 6;
    ensure(l, rowH);
    row.forEach((p, i) => {
      const tx = x + i * (THUMB_W + THUMB_GAP);
      drawThumb(l, loaded.get(p.sha256), tx, l.y);
      draw(l, captions[start + i], capStyle, tx, l.y + THUMB_H + 4, THUMB_W);
    });
    l.y += rowH;
  }
}

function findingBlock(l: Layout, f: NoticeDocument['findings'][number], loaded: Map<string, LoadedPhoto>) {
  const info = findingSeverityVocabulary[f.severity];
  const ink = markInk(info.mark);
  const bandH = 24;
  const indent = 12;
  const bodyW = l.width - indent;
  const firstRowH = Math.min(measure(l, f.description, S.body, bodyW - LABEL_W), lineHeight(l, S.body) * 2);
  ensure(l, bandH + 6 + firstRowH);

  const drawBand = (continued: boolean) => {
    const { doc } = l;
    const y = l.y;
    doc.rect(l.left, y, l.width, bandH).fill(C.surfaceSunk);
    doc.rect(l.left, y, 4, bandH).fill(ink.fg);
    const ts: TextStyle = { font: 'bold', size: 10.5, gap: 0, color: C.text };
    const ty = y + (bandH - l.doc.font(ts.font).fontSize(ts.size).currentLineHeight(false)) / 2;
    const label = continued ? `Finding ${f.number}, continued` : `Finding ${f.number}`;
    setStyle(l, ts);
    doc.text(label, l.left + indent, ty, { lineBreak: false });
    let x = l.left + indent + textWidth(l, label, ts) + 12;
    x += drawMarked(l, info.mark, info.label, { ...ts, font: 'semibold' }, x, ty);
    if (f.state !== 'open') {
      setStyle(l, { ...S.small, size: 8.5 });
      doc.text(`  ·  ${findingStateVocabulary[f.state].documentLabel}`, x, ty + 1.5, { lineBreak: false });
    }
    const due = f.dueOn ? `Due ${formatCalendarDate(f.dueOn)}` : 'No due date';
    const dueStyle: TextStyle = f.dueOn ? { ...ts, size: 11 } : { ...S.small, size: 9 };
    const dw = textWidth(l, due, dueStyle);
    if (f.dueOn) {
      doc
        .roundedRect(l.right - dw - 18, y + 3, dw + 14, bandH - 6, 3)
        .lineWidth(1)
        .fillAndStroke(C.surface, C.text);
    }
    draw(l, due, dueStyle, l.right - dw - 11, ty - 0.5, dw + 2, 'right');
    l.y = y + bandH + 6;
  };

  drawBand(false);
  withHook(
    l,
    () => drawBand(true),
    () => {
      const x = l.left + indent;
      flowPair(l, 'Found', f.description, S.body, x, bodyW);
      flowPair(l, 'Breaches', orNot(f.ruleRef, 'Not stated'), S.body, x, bodyW);
      flowPair(l, 'Required action', orNot(f.requiredAction, 'None required'), S.bodyStrong, x, bodyW);
      if (f.photos.length > 0) {
        const capH = lineHeight(l, S.small) * 2;
        ensure(l, THUMB_H + 10 + capH);
        draw(l, 'PHOTOS', S.label, x, l.y + 1.5, LABEL_W - 8);
        photoGrid(l, f.photos, loaded, x + LABEL_W, bodyW - LABEL_W);
      }
    },
  );
  l.y += 10;
}

export function findingsSection(l: Layout, n: NoticeDocument, loaded: Map<string, LoadedPhoto>) {
  heading(l, n.findings.length > 0 ? `Findings (${n.findings.length})` : 'Findings', 24 + 40);
  if (n.findings.length === 0) {
    flowText(l, 'No findings were recorded.', S.body, l.left, l.width);
    return;
  }
  const counts = [...findingSeverities]
    .reverse()
    .map((s) => [s, n.findings.filter((f) => f.severity === s).length] as const)
    .filter(([, c]) => c > 0);
  let x = l.left;
  const s: TextStyle = { ...S.body, font: 'semibold', size: 9 };
  for (const [sev, count] of counts) {
    const w = drawMarked(
      l,
      findingSeverityVocabulary[sev].mark,
      `${count} ${findingSeverityVocabulary[sev].label}`,
      s,
      x,
      l.y,
    );
    x += w + 16;
  }
  l.y += lineHeight(l, s) + 8;
  for (const f of n.findings) findingBlock(l, f, loaded);
}

export function severityLegend(l: Layout) {
  heading(l, 'What the severities mean', TABLE_START);
  table(
    l,
    [
      {
        title: 'Severity',
        share: 1.35,
        cell: (s: FindingSeverity) => ({
          text: findingSeverityVocabulary[s].label,
          style: { ...S.cell, font: 'semibold', color: markInk(findingSeverityVocabulary[s].mark).fg },
          mark: findingSeverityVocabulary[s].mark,
        }),
      },
      { title: 'Meaning', share: 3.4, cell: (s) => ({ text: findingSeverityVocabulary[s].description }) },
      {
        title: 'Ride may run',
        share: 1,
        cell: (s) => ({
          text: findingSeverityVocabulary[s].mayOperate ? 'Yes' : 'No',
          style: { ...S.cell, font: 'semibold' },
        }),
      },
    ],
    [...findingSeverities].reverse(),
    { continued: 'What the severities mean' },
  );
}
