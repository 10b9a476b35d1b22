/**
 * The JSON depth guard on the body parsers: its byte scan agrees with the nesting of the value JSON.parse
 * builds (the reference: depth counted on the parsed value, recursively), for random JSON including
 * strings full of brackets, quotes, escapes and non-ASCII text; and a body nested past the limit is a 400
 * before it is parsed, on the small parser and on the large one behind sign-in.
 */
import * as fc from 'fast-check';
import request from 'supertest';

import { jsonDepth, MAX_JSON_DEPTH } from '@/server/http/json-depth';

import { makeTestServer, signInAs, type TestServer } from './helpers';

/** Objects and arrays count one level each; anything else none. */
function depthOf(value: unknown): number {
  if (Array.isArray(value)) return 1 + Math.max(0, ...value.map(depthOf));
  if (typeof value === 'object' && value !== null)
    return 1 + Math.max(0, ...Object.values(value).map(depthOf));
  return 0;
}

test('the byte scan measures the depth JSON.parse builds', () => {
  const tricky = fc.oneof(fc.string(), fc.constantFrom('[{"', '\\', '\\"]}', '}}]]', 'é中😀"{'));
  fc.assert(
    fc.property(fc.jsonValue({ maxDepth: 8, stringUnit: 'grapheme' }), fc.array(tricky), (value, extras) => {
      const withText = Array.isArray(value) ? [...value, ...extras] : value;
      const text = JSON.stringify(withText);
      expect(jsonDepth(Buffer.from(text, 'utf8'))).toBe(depthOf(JSON.parse(text)));
    }),
    { seed: 42, numRuns: 300 },
  );
});

describe('over the HTTP parsers', () => {
  let server: TestServer;
  let token: string;
  beforeAll(async () => {
    server = await makeTestServer();
    token = await signInAs(server.app, 'inspector@pivotwatch.test');
  });
  afterAll(() => server.close());

  const nested = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);

  test.each([
    ['/api/loads/cycle', 'the small parser'],
    ['/api/sync/push', 'the push parser, after sign-in'],
  ])('%s (%s): at the limit it is parsed, one deeper is a 400 too_deep', async (path) => {
    const send = (body: string) =>
      request(server.app)
        .post(path)
        .set('Authorization', `Bearer ${token}`)
        .set('Content-Type', 'application/json')
        .send(body);
    const atLimit = await send(nested(MAX_JSON_DEPTH));
    expect(atLimit.status).toBe(400);
    expect(atLimit.body.error.code).not.toBe('too_deep');
    const over = await send(nested(MAX_JSON_DEPTH + 1));
    expect(over.status).toBe(400);
    expect(over.body.error.code).toBe('too_deep');
    const far = await send(nested(100_000));
    expect(far.body.error.code).toBe('too_deep');
  });
});
