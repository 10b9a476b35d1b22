/**
 * The notice link the server e-mails: checked against the WHATWG URL parser (Node's `URL`, the same
 * algorithm browsers use to open the link): the page is `/notices/<id>`, the id comes back whole however
 * it is spelled, and a trailing "/" on APP_URL gives no empty path segment.
 */
import { appLink, noticePath } from '@/lib/paths';

describe('lib/paths', () => {
  it('a notice link opens /notices/<id> on the public address, with or without a trailing slash', () => {
    for (const appUrl of [
      'https://pivotwatch.example',
      'https://pivotwatch.example/',
      'https://pivotwatch.example//',
    ]) {
      const url = new URL(appLink(appUrl, noticePath('7c9e6679-7425-40de-944b-e07fc1f90ae7')));
      expect(url.origin).toBe('https://pivotwatch.example');
      expect(url.pathname).toBe('/notices/7c9e6679-7425-40de-944b-e07fc1f90ae7');
    }
  });

  it('keeps an id with reserved characters in one path segment', () => {
    const id = 'a b/c?d#e';
    const url = new URL(appLink('https://pivotwatch.example', noticePath(id)));
    expect(url.search).toBe('');
    expect(url.hash).toBe('');
    const segments = url.pathname.split('/');
    expect(segments).toHaveLength(3);
    expect(decodeURIComponent(segments[2])).toBe(id);
  });

  it('keeps a path prefix of APP_URL (the app served under a sub-path)', () => {
    expect(appLink('https://example.test/pivotwatch/', noticePath('n1'))).toBe(
      'https://example.test/pivotwatch/notices/n1',
    );
  });
});
