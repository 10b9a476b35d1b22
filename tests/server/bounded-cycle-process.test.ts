/**
 * The cycle's worker thread in the server as `npm start` runs it (tsx server/main.ts in its own process),
 * not only under jest: the worker loads TypeScript through the same hook in both. The answer is checked
 * against the engine run in this process.
 */
import { analyseCycleRequest } from '@/features/loads/schema';
import { startPivotwatch, type Running } from '@/tests/support/browser/harness';

let running: Running;
beforeAll(async () => {
  running = await startPivotwatch({ SEED_DEMO: '1' });
}, 90_000);
afterAll(() => running?.stop());

test('a cycle analysed in the real server process matches the engine', async () => {
  const signIn = await fetch(`${running.baseUrl}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'inspector@pivotwatch.test', password: 'pivotwatch-demo' }),
  });
  expect(signIn.status).toBe(200);
  const { token } = (await signIn.json()) as { token: string };
  // A rod of 100 kg, 2 m, turning at 12 rpm; the reference is the same engine in this process.
  const body = {
    bodies: [{ name: 'arm', massKg: 100, cgM: [1, 0], inertiaCgKgM2: 100 / 3 }],
    profiles: [{ kind: 'constant', rpm: 12 }],
    samples: 360,
  };
  const res = await fetch(`${running.baseUrl}/api/loads/cycle`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Authorization: `Bearer ${token}` },
    body: JSON.stringify(body),
  });
  expect(res.status).toBe(200);
  const local = analyseCycleRequest(body);
  if (!local.ok) throw new Error('the reference request must be valid');
  // 360 samples of this chain fit the bounded answer whole (server/compute/cycle-series.ts).
  expect(await res.json()).toEqual({ ...JSON.parse(JSON.stringify(local.value)), resolution: 'full' });
}, 60_000);
