import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { Client, makeUser, testApp, useTestApp } from '../helpers/app';

const t = useTestApp();

/** Parses a Content-Security-Policy header into directive → sources (W3C CSP Level 3 §2.2). */
const policy = (header: string) =>
  Object.fromEntries(
    header
      .split(';')
      .map((part) => part.trim().split(/\s+/))
      .filter((words) => words[0])
      .map(([name, ...sources]) => [name, sources]),
  );

describe('security headers (OWASP ASVS 4.0 §14.4, §8.2.1)', () => {
  it('a CSP allowing only this origin, no framing, nosniff, a referrer policy, and no HSTS over plain HTTP', async () => {
    const res = await request(t.sheetsmith.app).get('/api/health');
    const csp = policy(res.headers['content-security-policy']);
    expect(csp['default-src']).toEqual(["'self'"]);
    expect(csp['script-src']).toEqual(["'self'"]); // no 'unsafe-inline', no 'unsafe-eval'
    expect(csp['style-src']).toEqual(["'self'"]);
    expect(csp['frame-ancestors']).toEqual(["'none'"]);
    expect(csp['object-src']).toEqual(["'none'"]);
    expect(csp['upgrade-insecure-requests']).toBeUndefined();
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('HSTS and upgrade-insecure-requests once the app is behind HTTPS (COOKIE_SECURE)', async () => {
    const secure = testApp(t.db, { COOKIE_SECURE: true });
    try {
      const res = await request(secure.app).get('/api/health');
      expect(res.headers['strict-transport-security']).toBe('max-age=31536000; includeSubDomains');
      expect(policy(res.headers['content-security-policy'])['upgrade-insecure-requests']).toEqual([]);
    } finally {
      await secure.close();
    }
  });

  it('API answers, errors included, are never stored by a browser or proxy', async () => {
    const user = await makeUser(t.db, 'cache');
    const client = new Client(t.sheetsmith.app);
    await client.signIn(user.email);
    for (const res of [
      await client.get('/api/me'),
      await client.get('/api/no-such-route'),
      await request(t.sheetsmith.app).get('/api/me'),
    ]) {
      expect(res.headers['cache-control']).toBe('no-store');
    }
  });
});
