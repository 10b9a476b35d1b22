/**
 * Honest state on the phone: the connection state follows what the network and the last request say
 * (not how the session was loaded), photos waiting are counted per photo attached, a record is listed
 * as sent only once the server has it, and "Everything is sent" is said only when it is true.
 */
// First: expo-network's native side stood in for, before the connection state loads (tests/support/phone-network.ts).
import { networkBecomes, noNetwork, wifi } from '@/tests/support/phone-network';
import { act, renderHook } from '@testing-library/react-native';

import { groupSent, type SentInspection } from '@/features/inspections/sent';
import { headline } from '@/features/inspections/sync-panel';
import { useOnline } from '@/features/sync/online-state';
import { photosWaitingCount } from '@/features/sync/photo-counts';
import { apiFetch } from '@/features/api/client';
import { OfflineError } from '@/lib/api-errors';
import { reportServerReached, serverReached } from '@/features/api/reachability';
import { noSignal, standInApi } from '@/tests/support/stand-in-api';

afterEach(() => reportServerReached(true));

describe('connection state', () => {
  test('follows the last request: a request that cannot reach the server, then one that can', () => {
    const { result } = renderHook(() => useOnline());
    expect(result.current).toBe(true);
    act(() => reportServerReached(false));
    expect(result.current).toBe(false);
    act(() => reportServerReached(true));
    expect(result.current).toBe(true);
  });

  test('the API client reports every outcome: no answer is offline, any answer (even an error) is online', async () => {
    try {
      noSignal('Failed to fetch');
      await expect(apiFetch('/api/health', { anonymous: true })).rejects.toBeInstanceOf(OfflineError);
      expect(serverReached()).toBe(false);
      standInApi(() => ({ status: 503, body: { ok: true } }));
      await expect(apiFetch('/api/health', { anonymous: true })).rejects.not.toBeInstanceOf(OfflineError);
      expect(serverReached()).toBe(true);
    } finally {
      jest.restoreAllMocks();
    }
  });

  test("on a phone, the network's return clears a failure from before (the next request decides)", () => {
    const { result } = renderHook(() => useOnline());
    act(() => reportServerReached(false));
    expect(result.current).toBe(false);
    networkBecomes(noNetwork);
    expect(result.current).toBe(false);
    networkBecomes(wifi);
    expect(result.current).toBe(true);
  });
});

describe('photos waiting', () => {
  const a = 'a'.repeat(64);
  const b = 'b'.repeat(64);
  test('one per photo attached: the same picture on two items is two photos, one upload', () => {
    expect(photosWaitingCount([{ photos: [{ sha256: a }, { sha256: a }] }], new Set([a]))).toBe(2);
  });
  test('photos already uploaded are not waiting, whatever record names them', () => {
    const records = [{ photos: [{ sha256: a }, { sha256: b }] }, { photos: [{ sha256: b }] }];
    expect(photosWaitingCount(records, new Set([a]))).toBe(1);
    expect(photosWaitingCount(records, new Set())).toBe(0);
  });
});

const item = (id: string, patch: Partial<SentInspection>): SentInspection => ({
  id,
  rideId: 'r1',
  rideName: 'Little Kite',
  type: 'periodic',
  submittedAt: '2026-12-03T08:00:00.000Z',
  send: 'sent',
  amends: null,
  decision: null,
  correction: null,
  needsAction: false,
  canCorrect: true,
  ...patch,
});

test('the sent list holds only what the server has; waiting and refused records have their own groups', () => {
  const list = [
    item('w', { send: 'waiting' }),
    item('s', { send: 'sent' }),
    item('x', { send: 'refused' }),
    item('u', { send: 'unknown' }),
    item('r', { send: 'sent', needsAction: true }),
  ];
  const g = groupSent(list);
  expect(g.waiting.map((s) => s.id)).toEqual(['w']);
  expect(g.refused.map((s) => s.id)).toEqual(['x']);
  expect(g.sent.map((s) => s.id)).toEqual(['s', 'u']);
  expect(g.returned.map((s) => s.id)).toEqual(['r']);
  expect(g.sent.every((s) => s.send === 'sent' || s.send === 'unknown')).toBe(true);
});

describe('the sync headline', () => {
  const none = { waiting: 0, photosWaiting: 0, needsAttention: [], photosRefused: [] };
  test('says everything is sent only when nothing waits and nothing was refused', () => {
    expect(headline(none)).toBe('Everything is sent');
    expect(headline({ ...none, waiting: 1 })).toBe('1 inspection waiting to send');
    expect(headline({ ...none, photosWaiting: 2 })).toBe('2 photos waiting to send');
    const refusedPhoto = { sha256: 'c'.repeat(64) } as (typeof none.photosRefused)[number];
    expect(headline({ ...none, photosRefused: [refusedPhoto] })).toBe('1 item refused by the server');
  });
  test('claims nothing before the phone’s counts are read (a reload drawn from the glimpse)', () => {
    expect(headline({ ...none, loaded: false })).toBe('Reading what waits on this phone…');
    expect(headline({ ...none, loaded: true })).toBe('Everything is sent');
  });
});
