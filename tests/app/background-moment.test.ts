/**
 * When a role's other areas start loading in the background after the first visit
 * (features/shell/load-shared.web.ts): never before the first screen says it has its content
 * (components/first-screen.ts), however soon the service worker takes control — on a slow phone Today's
 * first sync outlasts the worker's precache, and chunks loaded during it would compete with Today.
 * A reload the worker already held loads nothing ahead.
 */
type Listener = () => void;

function fakeWorker(controlled: boolean) {
  const listeners: Listener[] = [];
  const sw = {
    controller: controlled ? {} : null,
    addEventListener: (_: string, l: Listener) => listeners.push(l),
    takeControl() {
      sw.controller = {};
      listeners.splice(0).forEach((l) => l());
    },
  };
  // The test environment has no navigator of its own (a phone's, where this file is not used).
  Object.defineProperty(globalThis, 'navigator', { value: { serviceWorker: sw }, configurable: true });
  return sw;
}

/** A fresh copy of both modules (each keeps its state at module level, as on a page). */
async function load() {
  jest.resetModules();
  return {
    shared: jest.requireActual<typeof import('@/features/shell/load-shared.web')>(
      '@/features/shell/load-shared.web',
    ),
    first: jest.requireActual<typeof import('@/components/first-screen')>('@/components/first-screen'),
  };
}

function watch(p: Promise<boolean>) {
  const state: { value?: boolean } = {};
  void p.then((v) => (state.value = v));
  return state;
}

const flush = async () => {
  for (let i = 0; i < 5; i += 1) await Promise.resolve();
};

beforeEach(() => jest.useFakeTimers());
afterEach(() => jest.useRealTimers());

test('the worker taking control early waits for the first screen; then the areas load 2 s later', async () => {
  const sw = fakeWorker(false);
  const { shared, first } = await load();
  const moment = watch(shared.backgroundMoment());
  sw.takeControl();
  await jest.advanceTimersByTimeAsync(10_000);
  expect(moment.value).toBeUndefined();
  first.markFirstScreenSettled();
  await jest.advanceTimersByTimeAsync(1999);
  expect(moment.value).toBeUndefined();
  // Two seconds for the first look at the screen, then at once: the worker already holds the page.
  await jest.advanceTimersByTimeAsync(1);
  expect(moment.value).toBe(true);
});

test('settled first, then the worker takes control: the moment comes with the control', async () => {
  const sw = fakeWorker(false);
  const { shared, first } = await load();
  const moment = watch(shared.backgroundMoment());
  first.markFirstScreenSettled();
  await jest.advanceTimersByTimeAsync(3000);
  expect(moment.value).toBeUndefined();
  sw.takeControl();
  await flush();
  expect(moment.value).toBe(true);
});

test('a first screen that never settles: the areas still load 20 s, 2 s and the worker wait later', async () => {
  fakeWorker(false);
  const { shared } = await load();
  const moment = watch(shared.backgroundMoment());
  await jest.advanceTimersByTimeAsync(26_999);
  expect(moment.value).toBeUndefined();
  await jest.advanceTimersByTimeAsync(1);
  expect(moment.value).toBe(true);
});

test('a page the worker held from the start loads nothing ahead, settled or not', async () => {
  fakeWorker(true);
  const { shared } = await load();
  const moment = watch(shared.backgroundMoment());
  await flush();
  expect(moment.value).toBe(false);
});
