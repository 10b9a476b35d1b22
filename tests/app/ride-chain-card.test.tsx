/**
 * The ride page's record chain card (features/ride-page/chain-card.tsx): **Verify record** asks the server
 * and says the answer in plain words; opened from a notice's QR (`?verify=1`) it checks at once. The
 * answers are parsed with the API's own schema (chainVerificationSchema); ids are invented.
 */
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { fireEvent, render, screen } from '@testing-library/react-native';

import { chainVerificationSchema } from '@/features/ledger/schema';
import { ChainCard } from '@/features/ride-page/chain-card';
import { formatDate } from '@/lib/dates';

const mockParams: { verify?: string } = {};
jest.mock('expo-router', () => ({ useLocalSearchParams: () => mockParams }));

const mockApiFetch = jest.fn();
jest.mock('@/features/api', () => ({ apiFetch: (...args: unknown[]) => mockApiFetch(...args) }));

const intact = chainVerificationSchema.parse({
  rideId: 'ride-7',
  intact: true,
  entries: 9,
  checkedAt: '2026-05-04T10:00:00.000Z',
  break: null,
  signers: [
    { keyId: '0a1b2c3d4e5f6071', personName: 'Wren Halloway', records: 5, revokedAt: null },
    {
      keyId: '8192a3b4c5d6e7f8',
      personName: 'Odile Marsh',
      records: 1,
      revokedAt: '2026-04-20T08:00:00.000Z',
    },
  ],
  unsigned: 3,
});
const broken = chainVerificationSchema.parse({
  rideId: 'ride-7',
  intact: false,
  entries: 9,
  checkedAt: '2026-05-04T10:00:00.000Z',
  break: {
    seq: 6,
    kind: 'finding',
    refId: 'f-1',
    why: 'order',
    words: 'the order was changed: this entry does not follow the one stored before it',
  },
  signers: [],
  unsigned: 9,
});

function renderCard() {
  const qc = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={qc}>
      <ChainCard rideId="ride-7" />
    </QueryClientProvider>,
  );
}

beforeEach(() => {
  mockApiFetch.mockReset();
  delete mockParams.verify;
});

test('nothing is asked until Verify record is pressed; then the intact chain is said in words', async () => {
  mockApiFetch.mockResolvedValue(intact);
  renderCard();
  expect(mockApiFetch).not.toHaveBeenCalled();
  fireEvent.press(screen.getByRole('button', { name: 'Verify record' }));
  expect(
    await screen.findByText(/Intact: all 9 recorded changes match what the server accepted/),
  ).toBeTruthy();
  expect(mockApiFetch.mock.calls[0][0]).toBe('/api/rides/ride-7/chain/verify');
  // What a verification does not prove is said beside the result.
  expect(screen.getByText(/does not show that what was entered was true/)).toBeTruthy();
  // Whose phones signed the records, a withdrawn key marked with its date (formatDate, lib/dates).
  expect(screen.getByText('Signed on the phone by: Wren Halloway (5 records)')).toBeTruthy();
  expect(
    screen.getByText(
      `Signed on the phone by: Odile Marsh (1 record), key withdrawn ${formatDate('2026-04-20T08:00:00.000Z')}`,
    ),
  ).toBeTruthy();
});

test('opened from a notice (?verify=1) it checks at once and names the first breaking entry', async () => {
  mockParams.verify = '1';
  mockApiFetch.mockResolvedValue(broken);
  renderCard();
  expect(
    await screen.findByText(
      /Broken at entry 6 \(finding\): the order was changed: this entry does not follow the one stored before it\./,
    ),
  ).toBeTruthy();
});

test('a refused check is said, not hidden', async () => {
  mockApiFetch.mockRejectedValue(new Error('You may not do this.'));
  renderCard();
  fireEvent.press(screen.getByRole('button', { name: 'Verify record' }));
  expect(await screen.findByText(/The check could not be made: You may not do this\./)).toBeTruthy();
});
