/**
 * Words and numbers of the outbox screen. Pure: no React, so the rules are easy to check.
 */

export { formatBytes } from '@/lib/bytes';

const NAMED_ENTITIES: Record<string, string> = {
  amp: '&',
  lt: '<',
  gt: '>',
  quot: '"',
  apos: "'",
  nbsp: ' ',
  middot: '·',
  ndash: '–',
  mdash: '—',
  rsquo: '’',
  lsquo: '‘',
  rdquo: '”',
  ldquo: '“',
  hellip: '…',
};

function decodeEntities(text: string): string {
  return text.replace(/&(#x[0-9a-f]+|#\d+|[a-z]+);/gi, (whole, name: string) => {
    if (name[0] === '#') {
      const code =
        name[1] === 'x' || name[1] === 'X' ? parseInt(name.slice(2), 16) : parseInt(name.slice(1), 10);
      // Control characters and values outside Unicode stay as written.
      return code >= 32 && code <= 0x10ffff ? String.fromCodePoint(code) : whole;
    }
    return NAMED_ENTITIES[name.toLowerCase()] ?? whole;
  });
}

/**
 * An HTML body as plain text, for a message that has no text part. The HTML is never rendered: elements
 * whose content is not text (script, style, head, …) go with their content, comments go, every other tag
 * goes, block ends become line breaks, link targets are written after their words, and entities are
 * decoded last, so nothing decoded can turn back into markup.
 */
export function htmlToText(html: string): string {
  let s = html.replace(/<!--[\s\S]*?(-->|$)/g, '');
  s = s.replace(
    /<(script|style|head|title|template|noscript|iframe|object|svg|math)\b[\s\S]*?(<\/\1\s*>|$)/gi,
    '',
  );
  s = s.replace(
    /<a\b[^>]*?\bhref\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+))[^>]*>([\s\S]*?)<\/a\s*>/gi,
    (...m) => {
      const href = String(m[1] ?? m[2] ?? m[3] ?? '').trim();
      const words = String(m[4]);
      return href && !/^(javascript|data|vbscript):/i.test(href) && !words.includes(href)
        ? `${words} (${href})`
        : words;
    },
  );
  s = s.replace(/<br\s*\/?>/gi, '\n');
  s = s.replace(/<li\b[^>]*>/gi, '\n• ');
  s = s.replace(/<\/(p|div|h[1-6]|tr|table|ul|ol|section|article|header|footer|blockquote|pre)\s*>/gi, '\n');
  s = s.replace(/<\/t[dh]\s*>/gi, '\t');
  s = s.replace(/<[^>]*>?/g, '');
  s = decodeEntities(s);
  return s
    .split('\n')
    .map((line) => line.replace(/[ \t\r\f\v]+/g, ' ').trim())
    .join('\n')
    .replace(/\n{3,}/g, '\n\n')
    .trim();
}

/**
 * The name an attachment is saved under: its own name made safe for a file system (the same rule the
 * server uses for its download header), or "attachment-<n>" when it has none.
 */
export function attachmentFileName(a: { index: number; filename: string | null }): string {
  const safe = (a.filename ?? '')
    .trim()
    .replace(/[^\w.-]+/g, '_')
    .replace(/^\.+/, '');
  return safe || `attachment-${a.index + 1}`;
}
