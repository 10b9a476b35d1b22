/**
 * Network state in the browser (features/sync/network.web.ts): `navigator.onLine` and the window's
 * `online`/`offline` events (HTML Living Standard, "Navigator.onLine" and the events it fires), the
 * document's `visibilitychange` for focus (Page Visibility, HTML Living Standard). The app project runs
 * as a phone under jest, so the web module is loaded by its own name, with a window, a navigator and a
 * document stood in for by plain EventTargets; react-query's managers are wired to it as the web build
 * wires them (TanStack Query v5 docs, "onlineManager", "focusManager").
 */
import { focusManager, onlineManager } from '@tanstack/react-query';

jest.mock('@/features/sync/network', () => jest.requireActual('@/features/sync/network.web'));

const win = new EventTarget();
const doc = Object.assign(new EventTarget(), { visibilityState: 'visible' as 'visible' | 'hidden' });
let onLine = true;
const nav = {
  get onLine() {
    return onLine;
  },
};
const names = ['window', 'document', 'navigator'] as const;
const saved = names.map((n) => Object.getOwnPropertyDescriptor(globalThis, n));
const stand = (name: (typeof names)[number], value: unknown) =>
  Object.defineProperty(globalThis, name, { value, configurable: true, writable: true });

beforeAll(() => {
  stand('window', win);
  stand('document', doc);
  stand('navigator', nav);
});
afterAll(() => {
  names.forEach((n, i) => {
    const d = saved[i];
    if (d) Object.defineProperty(globalThis, n, d);
    else delete (globalThis as Record<string, unknown>)[n];
  });
});

/** What the browser does when the connection goes or comes back: the flag, then the event. */
function browserGoes(state: 'online' | 'offline') {
  onLine = state === 'online';
  win.dispatchEvent(new Event(state));
}

test('isOnline reads navigator.onLine; the window events reach every listener, and unsubscribing stops them', () => {
  const net = jest.requireActual(
    '@/features/sync/network.web',
  ) as typeof import('@/features/sync/network.web');
  const seen: boolean[] = [];
  const returns: number[] = [];
  const off = net.onNetworkChange((o) => seen.push(o));
  const offReturn = net.onConnectionReturn(() => returns.push(1));
  browserGoes('offline');
  expect(net.isOnline()).toBe(false);
  browserGoes('online');
  expect(net.isOnline()).toBe(true);
  off();
  offReturn();
  browserGoes('offline');
  browserGoes('online');
  expect(seen).toEqual([false, true]);
  expect(returns).toEqual([1]);
});

test("react-query's onlineManager and focusManager follow the browser", () => {
  const { wireQueryNetwork } = jest.requireActual('@/features/sync/query-network') as {
    wireQueryNetwork: () => void;
  };
  wireQueryNetwork();
  browserGoes('offline');
  expect(onlineManager.isOnline()).toBe(false);
  browserGoes('online');
  expect(onlineManager.isOnline()).toBe(true);
  doc.visibilityState = 'hidden';
  doc.dispatchEvent(new Event('visibilitychange'));
  expect(focusManager.isFocused()).toBe(false);
  doc.visibilityState = 'visible';
  doc.dispatchEvent(new Event('visibilitychange'));
  expect(focusManager.isFocused()).toBe(true);
});
