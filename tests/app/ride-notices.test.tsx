/**
 * One notice as the ride's page and the review desk list it (features/review/ride-notices.tsx): a link to
 * the notice with its reference, kind, issue, acknowledgement, findings still to close and e-mail state.
 * The list item is parsed with the API's schema (noticeListItemSchema); names are the invented demo.
 */
import { render, screen } from '@testing-library/react-native';

import { type NoticeListItem, noticeListItemSchema } from '@/features/notices/schema';
import { NoticeRow } from '@/features/notices/ride-notices';

const statusNotice: NoticeListItem = noticeListItemSchema.parse({
  id: 'n-3',
  reference: 'PW-2026-0009',
  kind: 'status_change',
  inspectionId: null,
  rideId: 'ride-3',
  rideName: 'Gull Wing',
  operatorId: 'op-1',
  operatorName: 'Tamsworth Pier Leisure',
  issuedAt: '2026-06-04T09:15:00.000Z',
  issuedByName: 'Mara Quill',
  acknowledgedAt: null,
  acknowledgedByName: null,
  delivery: { state: 'no_address', total: 0, sent: 0, failed: 0 },
  openFindings: 2,
  findingsTotal: 2,
});

test('a notice row says what the notice is and where it stands, and links to it', () => {
  render(<NoticeRow notice={statusNotice} />);
  const link = screen.getByRole('link', { name: 'Notice PW-2026-0009' });
  expect(link.props.href).toBe('/notices/n-3');
  expect(screen.getByText(/PW-2026-0009/)).toBeTruthy();
  expect(screen.getByText(/Ride status notice/)).toBeTruthy();
  expect(screen.getByText(/Issued .* by Mara Quill/)).toBeTruthy();
  expect(screen.getByText(/Not acknowledged yet/)).toBeTruthy();
  expect(screen.getByText('2 of 2 findings not closed')).toBeTruthy();
  expect(screen.getByLabelText('E-mail: No address')).toBeTruthy();
});

test('an acknowledged notice names who acknowledged it', () => {
  render(
    <NoticeRow
      notice={{
        ...statusNotice,
        acknowledgedAt: '2026-06-04T16:40:00.000Z',
        acknowledgedByName: 'Pell Harrow',
        openFindings: 0,
        delivery: { state: 'sent', total: 1, sent: 1, failed: 0 },
      }}
    />,
  );
  expect(screen.getByText(/Acknowledged .* by Pell Harrow/)).toBeTruthy();
  expect(screen.getByText('All 2 findings closed')).toBeTruthy();
  expect(screen.getByLabelText('E-mail: Sent')).toBeTruthy();
});
