import request from 'supertest';
import { ApiClient, cookieFrom, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

describe('security', () => {
  let t: TestApp;
  let shop: TestShop;

  beforeAll(async () => {
    t = await startTestApp({ LOGIN_MAX_FAILURES: '10', LOGIN_WINDOW_MINUTES: '15' });
    shop = await createTestShop(t.db, 'security');
  });
  afterAll(() => t.close());

  describe('CSRF', () => {
    it('When a sign-in comes without the X-XSRF-TOKEN header, then 403', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.agent
        .post('/api/auth/login')
        .send({ email: shop.emails.tuner, password: TEST_PASSWORD });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf');
    });

    it('When the header does not match the cookie, then 403', async () => {
      const client = await new ApiClient(t.app).prime();
      const other = await new ApiClient(t.app).prime();
      const res = await client.agent
        .post('/api/auth/login')
        .set('X-XSRF-TOKEN', other.xsrf)
        .send({ email: shop.emails.tuner, password: TEST_PASSWORD });
      expect(res.status).toBe(403);
    });

    it('When a forged token (header and cookie agree, bad signature) is sent, then 403', async () => {
      const forged = 'abcdefghijklmnopqrstuvwx.forgedsignature';
      const res = await request(t.app)
        .post('/api/auth/login')
        .set('Cookie', `XSRF-TOKEN=${forged}`)
        .set('X-XSRF-TOKEN', forged)
        .send({ email: shop.emails.tuner, password: TEST_PASSWORD });
      expect(res.status).toBe(403);
    });

    it('When a signed-in change comes without the header, then 403 and nothing changes', async () => {
      const admin = await signedIn(t.app, shop.emails.admin, TEST_PASSWORD);
      const target = shop.userIds[shop.emails.operator];
      const res = await admin.agent.patch(`/api/team/members/${target}`).send({ roles: ['tuner'] });
      expect(res.status).toBe(403);
      const members = await admin.get('/api/team/members');
      const operator = (members.body.items as { id: string; roles: string[] }[]).find(
        (m) => m.id === target,
      );
      expect(operator?.roles).toEqual(['operator']);
    });
  });

  describe('sign-in rate limit', () => {
    it('When 10 sign-ins failed for one account and address, then the 11th gets 429 with Retry-After', async () => {
      const client = await new ApiClient(t.app).prime();
      for (let i = 0; i < 10; i++) {
        const res = await client.post('/api/auth/login', {
          email: shop.emails.reviewer,
          password: `wrong-${i}`,
        });
        expect(res.status).toBe(401);
      }
      const blocked = await client.post('/api/auth/login', {
        email: shop.emails.reviewer,
        password: TEST_PASSWORD,
      });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('too_many_requests');
      expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
      expect(Number(blocked.headers['retry-after'])).toBeLessThanOrEqual(15 * 60);
      // Another account from the same address is not affected.
      const other = await client.post('/api/auth/login', {
        email: shop.emails.operator,
        password: TEST_PASSWORD,
      });
      expect(other.status).toBe(200);
    });

    it('When sign-ins succeed, then they do not count toward the limit', async () => {
      const client = await new ApiClient(t.app).prime();
      for (let i = 0; i < 15; i++) {
        const res = await client.post('/api/auth/login', {
          email: shop.emails.tuner,
          password: TEST_PASSWORD,
        });
        expect(res.status).toBe(200);
      }
      for (let i = 0; i < 9; i++) {
        await client.post('/api/auth/login', {
          email: shop.emails.tuner,
          password: 'wrong-password',
        });
      }
      const res = await client.post('/api/auth/login', {
        email: shop.emails.tuner,
        password: TEST_PASSWORD,
      });
      expect(res.status).toBe(200);
    });
  });

  describe('headers', () => {
    it('When any response goes out, then it carries a strict CSP with a fresh nonce', async () => {
      const a = await request(t.app).get('/api/health');
      const b = await request(t.app).get('/api/health');
      const csp = a.headers['content-security-policy'] as string;
      expect(csp).toContain("default-src 'self'");
      expect(csp).toContain("script-src 'self'");
      expect(csp).toContain("object-src 'none'");
      expect(csp).toContain("frame-ancestors 'none'");
      expect(csp).not.toContain('unsafe-inline');
      const nonce = /'nonce-([^']+)'/.exec(csp)?.[1];
      expect(nonce).toBeDefined();
      expect(b.headers['content-security-policy']).not.toContain(nonce);
      expect(a.headers['x-powered-by']).toBeUndefined();
      expect(a.headers['x-content-type-options']).toBe('nosniff');
    });

    it('When the XSRF cookie is set, then scripts can read it but it stays on our site', async () => {
      const res = await request(t.app).get('/api/health');
      const line = (res.headers['set-cookie'] as unknown as string[]).find((c) =>
        c.startsWith('XSRF-TOKEN='),
      );
      expect(line).toMatch(/SameSite=Strict/i);
      expect(line).not.toMatch(/HttpOnly/i);
      expect(cookieFrom(res, 'XSRF-TOKEN')).toBeTruthy();
    });
  });
});
