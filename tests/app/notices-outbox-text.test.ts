/**
 * The outbox's words and numbers: byte counts with SI prefixes, HTML bodies as plain text (checked against
 * the `entities` package's decoder, a general-purpose HTML entity library), and safe attachment names.
 */
import { decodeHTML } from 'entities';

import { attachmentFileName, formatBytes, htmlToText } from '@/features/notices/outbox-text';

describe('formatBytes', () => {
  // SI prefixes (BIPM SI Brochure, 9th ed., table 7; IEC 80000-13 keeps kilo = 1000 for bytes).
  test.each([
    [0, '0 B'],
    [999, '999 B'],
    [1000, '1.00 kB'],
    [84_312, '84.3 kB'],
    [999_499, '999 kB'],
    [999_500, '1.00 MB'],
    [1_250_000, '1.25 MB'],
    [3_000_000_000, '3.00 GB'],
  ])('%d bytes → %s', (bytes, words) => {
    expect(formatBytes(bytes)).toBe(words);
  });

  test('nonsense is a dash, not a number', () => {
    expect(formatBytes(-1)).toBe('—');
    expect(formatBytes(Number.NaN)).toBe('—');
  });
});

describe('htmlToText', () => {
  test('entities decode as the entities package decodes them', () => {
    const sample = '&amp; &lt; &gt; &quot; &apos; &middot; &ndash; &mdash; &rsquo; &hellip; &#233; &#x2713;';
    expect(htmlToText(sample)).toBe(decodeHTML(sample));
  });

  test('entities are decoded once: escaped markup stays text and is never parsed again', () => {
    expect(htmlToText('&lt;script&gt;alert(1)&lt;/script&gt;')).toBe('<script>alert(1)</script>');
    expect(htmlToText('&amp;lt;b&amp;gt;')).toBe('&lt;b&gt;');
  });

  test('scripts, styles, heads and comments go with their content; tags go; blocks become lines', () => {
    const html =
      '<html><head><title>t</title><style>p{}</style></head><body><!-- hidden -->' +
      '<p>First <b>line</b></p><script type="text/javascript">steal()</script><div>Second<br>third</div>' +
      '<ul><li>pin</li><li>bushing</li></ul></body></html>';
    expect(htmlToText(html)).toBe('First line\nSecond\nthird\n\n• pin\n• bushing');
  });

  test('links keep their target in brackets, except script targets', () => {
    expect(htmlToText('<a href="https://pivotwatch.example/notices/n-1">Open the notice</a>')).toBe(
      'Open the notice (https://pivotwatch.example/notices/n-1)',
    );
    expect(htmlToText('<a href="javascript:steal()">Click</a>')).toBe('Click');
  });

  test('an unclosed script or tag still shows nothing of itself', () => {
    expect(htmlToText('Before<script>steal()')).toBe('Before');
    expect(htmlToText('Before<img src=x onerror=steal()')).toBe('Before');
  });
});

describe('attachmentFileName', () => {
  test('keeps a plain name, makes others safe, and names a nameless one by its position', () => {
    expect(attachmentFileName({ index: 0, filename: 'PW-2026-0007.pdf' })).toBe('PW-2026-0007.pdf');
    expect(attachmentFileName({ index: 0, filename: '../../etc/passwd' })).toBe('_.._etc_passwd');
    expect(attachmentFileName({ index: 2, filename: null })).toBe('attachment-3');
    expect(attachmentFileName({ index: 1, filename: '   ' })).toBe('attachment-2');
  });
});
