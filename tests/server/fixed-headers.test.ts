// fixedHeaders replays what a header middleware set once; checked against helmet itself (the
// reference) sending the same headers on a real request, and refused for a middleware that reads
// the request.
import { describe, expect, it } from 'vitest';
import express, { type RequestHandler } from 'express';
import helmet from 'helmet';
import request from 'supertest';
import { fixedHeaders } from '../../server/middleware/fixed-headers';

const served = (mw: RequestHandler) => {
  const app = express();
  app.disable('x-powered-by');
  app.use(mw);
  app.get('/', (_req, res) => { res.send('ok'); });
  return request(app).get('/');
};
const securityHeaders = (h: Record<string, unknown>) => Object.fromEntries(Object.entries(h).filter(([k]) => !['date', 'etag', 'content-length', 'content-type', 'connection', 'keep-alive'].includes(k)));

describe('fixedHeaders', () => {
  for (const [name, options] of [['default', undefined], ['plain HTTP', { contentSecurityPolicy: { directives: { upgradeInsecureRequests: null } }, strictTransportSecurity: false }]] as const) {
    it(`sends exactly the headers helmet sends (${name} options)`, async () => {
      const direct = await served(helmet(options));
      const replayed = await served(fixedHeaders(helmet(options)));
      expect(Object.keys(securityHeaders(direct.headers)).length).toBeGreaterThan(8);
      expect(securityHeaders(replayed.headers)).toEqual(securityHeaders(direct.headers));
    });
  }

  it('refuses a middleware whose headers depend on the request', () => {
    const perRequest: RequestHandler = (req, res, next) => { res.setHeader('x-path', req.path); next(); };
    expect(() => fixedHeaders(perRequest)).toThrow(/read req\.path/);
  });
});
