import { zodIssues } from '@/features/api/errors';
import { z } from 'zod';
test('zod issues carry a dotted path', () => {
  const r = z.object({ a: z.array(z.object({ b: z.number() })) }).safeParse({ a: [{ b: 'x' }] });
  expect(r.success).toBe(false);
  if (!r.success) expect(zodIssues(r.error)[0].path).toBe('a.0.b');
});
