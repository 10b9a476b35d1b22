/**
 * The notice view writes its issue time on the site's clock it was issued with, naming the zone, as the
 * notice's e-mail and PDF do; a notice from before site zones prints UTC. 02:00 UTC on 3 Dec 2026 is
 * 18:00 on 2 Dec in Los Angeles (PST, UTC−08:00 in December; IANA tz database).
 */
import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react-native';

import { makeQueryClient } from '@/features/api/query-client';
import { NoticeDocumentView } from '@/features/notices/notice-document-view';
import type { NoticeDocument } from '@/features/notices/schema';
import { fixtureNotice } from '@/scripts/sample-notice';

function show(document: NoticeDocument) {
  render(
    <QueryClientProvider client={makeQueryClient()}>
      <NoticeDocumentView document={document} />
    </QueryClientProvider>,
  );
}

const issuedAt = '2026-12-03T02:00:00.000Z';

test('issued on the site’s clock, with the zone named', () => {
  show({ ...fixtureNotice, issuedAt, timeZone: 'America/Los_Angeles', findings: [] });
  expect(screen.getByText(/Issued 2 Dec 2026, 18:00 America\/Los_Angeles \(UTC−08:00\)/)).toBeTruthy();
});

test('a notice issued before site zones prints UTC', () => {
  show({ ...fixtureNotice, issuedAt, timeZone: undefined, findings: [] });
  expect(screen.getByText(/Issued 3 Dec 2026, 02:00 UTC/)).toBeTruthy();
});
