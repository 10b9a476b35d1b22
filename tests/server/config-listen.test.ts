/**
 * Where the server listens (HOST), when it seeds the demo users (SEED_DEMO), whose address the sign-in
 * limits count (TRUST_PROXY) and how long a token lives (JWT_TTL). Address forms follow RFC 4291 (IPv6),
 * RFC 5735 (127.0.0.0/8 is loopback) and the range names of the `proxy-addr` package that Express uses.
 */
import express from 'express';
import request from 'supertest';

import { ConfigError, demoSeedingReason, isLoopbackHost, parseEnv } from '@/server/config';

describe('HOST', () => {
  test('defaults to IPv4 loopback, so a fresh start is reachable from this machine only', () => {
    expect(parseEnv({}).host).toBe('127.0.0.1');
    expect(parseEnv({ HOST: '' }).host).toBe('127.0.0.1');
  });

  test.each(['0.0.0.0', '::', '::1', '192.168.4.20', 'localhost', 'pivotwatch.site.test'])(
    'accepts %s',
    (host) => {
      expect(parseEnv({ HOST: host }).host).toBe(host);
    },
  );

  test.each(['http://0.0.0.0', '0.0.0.0:8080', 'two words', '-bad-'])('refuses %s, naming HOST', (host) => {
    expect(() => parseEnv({ HOST: host })).toThrow(ConfigError);
    expect(() => parseEnv({ HOST: host })).toThrow(/\bHOST:/);
  });

  test.each([
    ['127.0.0.1', true],
    ['127.8.9.10', true], // all of 127.0.0.0/8 is loopback (RFC 5735 §3)
    ['::1', true], // RFC 4291 §2.5.3
    ['::ffff:127.0.0.1', true], // IPv4-mapped (RFC 4291 §2.5.5.2)
    ['localhost', true],
    ['LOCALHOST', true],
    ['0.0.0.0', false],
    ['::', false],
    ['10.0.0.5', false],
    ['128.0.0.1', false],
    ['pivotwatch.site.test', false],
  ])('%s is loopback: %p', (host, loopback) => {
    expect(isLoopbackHost(host)).toBe(loopback);
  });
});

describe('SEED_DEMO: seeded only on loopback or when asked for', () => {
  test.each([
    [{}, true],
    [{ HOST: '::1' }, true],
    [{ SEED_DEMO: '0' }, false],
    [{ HOST: '0.0.0.0' }, false],
    [{ HOST: '192.168.4.20', NODE_ENV: 'test' }, false],
    [{ HOST: '0.0.0.0', SEED_DEMO: '1' }, true],
    [{ HOST: '0.0.0.0', SEED_DEMO: '0' }, false],
    [{ NODE_ENV: 'production' }, false],
    [{ NODE_ENV: 'production', HOST: '127.0.0.1', SEED_DEMO: '0' }, false],
  ])('%p → %p', (env, seeds) => {
    expect(parseEnv(env).seedDemo).toBe(seeds);
  });

  test('SEED_DEMO=1 in production is refused with the reason, not silently ignored', () => {
    const attempt = () => parseEnv({ NODE_ENV: 'production', SEED_DEMO: '1', HOST: '0.0.0.0' });
    expect(attempt).toThrow(ConfigError);
    expect(attempt).toThrow(/SEED_DEMO: .*published password.*create-admin/s);
  });

  test('SEED_DEMO takes only 0 or 1', () => {
    expect(() => parseEnv({ SEED_DEMO: 'yes' })).toThrow(/\bSEED_DEMO:/);
  });

  test('the start-up log says which rule decided', () => {
    const reason = (env: Record<string, string>) => demoSeedingReason(parseEnv(env));
    expect(reason({})).toMatch(/seeded .*127\.0\.0\.1 is loopback/);
    expect(reason({ HOST: '0.0.0.0' })).toMatch(/not seeded .*0\.0\.0\.0 is not loopback.*SEED_DEMO=1/);
    expect(reason({ HOST: '0.0.0.0', SEED_DEMO: '1' })).toMatch(/because SEED_DEMO=1/);
    expect(reason({ SEED_DEMO: '0' })).toMatch(/not seeded \(SEED_DEMO=0\)/);
    expect(reason({ NODE_ENV: 'production' })).toMatch(/never seeded in production/);
  });
});

describe('TRUST_PROXY: a hop count or proxy addresses, never true', () => {
  test('true is refused, explaining why and what to give instead', () => {
    const attempt = () => parseEnv({ TRUST_PROXY: 'true' });
    expect(attempt).toThrow(ConfigError);
    expect(attempt).toThrow(/TRUST_PROXY: must not be true: .*X-Forwarded-For.*number of proxies/s);
  });

  test.each([
    ['unset', undefined, false],
    ['false', 'false', false],
    ['0', '0', false],
    ['2', '2', 2],
    ['loopback', 'loopback', ['loopback']],
    ['several', ' loopback , 10.0.0.5, 192.168.0.0/16 ', ['loopback', '10.0.0.5', '192.168.0.0/16']],
    ['IPv6 and a netmask', 'fd00::/8, 10.1.0.0/255.255.0.0', ['fd00::/8', '10.1.0.0/255.255.0.0']],
    ['linklocal and uniquelocal', 'linklocal,uniquelocal', ['linklocal', 'uniquelocal']],
  ])('%s → %p', (_label, value, expected) => {
    expect(parseEnv(value === undefined ? {} : { TRUST_PROXY: value }).trustProxy).toEqual(expected);
  });

  test.each(['yes', '10.0.0.300', '10.0.0.0/33', '::/129', 'example.test', '10.0.0.5,'])(
    '%s is refused, naming TRUST_PROXY',
    (value) => {
      expect(() => parseEnv({ TRUST_PROXY: value })).toThrow(/\bTRUST_PROXY:/);
    },
  );

  test('Express takes each accepted value, and believes X-Forwarded-For only from a trusted proxy', async () => {
    const clientIp = async (trustProxy: string, forwardedFor: string) => {
      const app = express();
      // Express compiles the setting with proxy-addr here and throws on a value it cannot read.
      app.set('trust proxy', parseEnv({ TRUST_PROXY: trustProxy }).trustProxy);
      app.get('/', (req, res) => res.json({ ip: req.ip }));
      const res = await request(app).get('/').set('X-Forwarded-For', forwardedFor);
      return res.body.ip as string;
    };
    // supertest connects over loopback, so the "proxy" here is 127.0.0.1.
    expect(await clientIp('loopback, 10.0.0.0/8, fd00::/8', '203.0.113.9')).toBe('203.0.113.9');
    expect(await clientIp('1', '198.51.100.1, 203.0.113.9')).toBe('203.0.113.9');
    expect(await clientIp('10.0.0.0/8', '203.0.113.9')).toMatch(/127\.0\.0\.1$/);
    expect(await clientIp('false', '203.0.113.9')).toMatch(/127\.0\.0\.1$/);
    expect(await clientIp('10.1.0.0/255.255.0.0, linklocal, uniquelocal', '203.0.113.9')).toMatch(
      /127\.0\.0\.1$/,
    );
  });
});

describe('JWT_TTL: at most 7 days', () => {
  test.each([
    ['7d', 604800],
    ['168h', 604800],
    ['604800', 604800],
    ['12h', 43200],
  ])('%s is allowed (%d s)', (ttl, seconds) => {
    expect(parseEnv({ JWT_TTL: ttl }).jwtTtlSeconds).toBe(seconds);
  });

  test.each(['8d', '169h', '604801', '30d'])('%s is refused, naming JWT_TTL and the cap', (ttl) => {
    expect(() => parseEnv({ JWT_TTL: ttl })).toThrow(ConfigError);
    expect(() => parseEnv({ JWT_TTL: ttl })).toThrow(/JWT_TTL: must be at most 7d \(604800 seconds\)/);
  });
});
