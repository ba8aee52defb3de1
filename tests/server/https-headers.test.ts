import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { makeTestApp, type TestApp } from './test-app';

/**
 * HTTPS-only headers only where the browser came over HTTPS. HSTS: RFC 6797 (a UA ignores it over
 * plain HTTP, §8.1, but a proxy that terminates TLS passes it on); upgrade-insecure-requests: W3C
 * Upgrade Insecure Requests. X-Forwarded-Proto is believed from the proxies Express trusts
 * (loopback by default: supertest connects from 127.0.0.1).
 */
let t: TestApp;
beforeAll(async () => { t = await makeTestApp(); });
afterAll(async () => { await t.close(); });

describe('security headers and the shop network', () => {
  it('over plain HTTP: no HSTS and no upgrade of requests, the rest of the policy kept', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.headers['strict-transport-security']).toBeUndefined();
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['content-security-policy']).not.toMatch(/upgrade-insecure-requests/);
  });

  it('behind a TLS proxy that says so: HSTS and upgrade-insecure-requests', async () => {
    const res = await request(t.app).get('/api/health').set('X-Forwarded-Proto', 'https').expect(200);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    expect(res.headers['content-security-policy']).toMatch(/upgrade-insecure-requests/);
  });
});
