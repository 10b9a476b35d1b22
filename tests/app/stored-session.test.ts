import { parseStoredSession } from '@/features/session/stored-session';

const user = {
  id: 'u1',
  email: 'a@b.test',
  name: 'A B',
  role: 'inspector',
  companyId: null,
  companyName: null,
};

test('a well-formed stored session is read back', () => {
  const raw = JSON.stringify({ token: 't', expiresAt: '2030-01-01T00:00:00Z', user });
  expect(parseStoredSession(raw)?.user.email).toBe('a@b.test');
});

test.each([
  null,
  '',
  'not json',
  '{"token":1}',
  JSON.stringify({ token: 't', user: { ...user, role: 'root' } }),
])('a damaged stored session (%s) reads as signed out', (raw) => {
  expect(parseStoredSession(raw)).toBeNull();
});
