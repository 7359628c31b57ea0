import request from 'supertest';
import { ApiClient, cookieFrom, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

describe('auth routes', () => {
  let t: TestApp;
  let shop: TestShop;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'auth');
  });
  afterAll(() => t.close());

  describe('GET /api/health', () => {
    it('When the database answers, then it says ok and sets the XSRF cookie', async () => {
      const res = await request(t.app).get('/api/health');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ ok: true });
      expect(cookieFrom(res, 'XSRF-TOKEN')).toMatch(/^[\w-]+\.[\w-]+$/);
    });
  });

  describe('POST /api/auth/login', () => {
    it('When the password is right, then it answers the user with roles and shop', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.post('/api/auth/login', {
        email: shop.emails.tuner,
        password: TEST_PASSWORD,
      });
      expect(res.status).toBe(200);
      expect(res.body.user).toMatchObject({
        id: shop.userIds[shop.emails.tuner],
        email: shop.emails.tuner,
        roles: ['tuner'],
        shopId: shop.id,
      });
      const sessionCookie = (res.headers['set-cookie'] as unknown as string[]).find((c) =>
        c.startsWith('cellsmith.sid='),
      );
      expect(sessionCookie).toMatch(/HttpOnly/i);
      expect(sessionCookie).toMatch(/SameSite=Lax/i);
    });

    it('When the e-mail differs only in case, then it still signs in', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.post('/api/auth/login', {
        email: shop.emails.tuner.toUpperCase(),
        password: TEST_PASSWORD,
      });
      expect(res.status).toBe(200);
    });

    it('When the password is wrong, then 401 in the error shape', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.post('/api/auth/login', {
        email: shop.emails.tuner,
        password: 'nope-nope',
      });
      expect(res.status).toBe(401);
      expect(res.body).toEqual({
        error: { code: 'not_signed_in', message: 'Wrong e-mail or password' },
      });
    });

    it('When the account is unknown, then the same 401', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.post('/api/auth/login', {
        email: 'nobody@shop.test',
        password: 'whatever1',
      });
      expect(res.status).toBe(401);
      expect(res.body.error.message).toBe('Wrong e-mail or password');
    });

    it('When the body is invalid, then 400 with the zod issues and their paths', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.post('/api/auth/login', { email: 'not-an-email' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      const paths = (res.body.error.details.issues as { path: string }[]).map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.password']));
    });

    it('When the JSON is malformed, then 400 without a stack trace', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.agent
        .post('/api/auth/login')
        .set('X-XSRF-TOKEN', client.xsrf)
        .set('Content-Type', 'application/json')
        .send('{"email": ');
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.text).not.toMatch(/at .*\.(ts|js):\d+/);
    });

    it('When signing in again, then the session id changes and the old one is dead', async () => {
      const client = await new ApiClient(t.app).prime();
      const first = await client.signIn(shop.emails.tuner, TEST_PASSWORD);
      const firstSid = cookieFrom(first, 'cellsmith.sid');
      const second = await client.signIn(shop.emails.operator, TEST_PASSWORD);
      const secondSid = cookieFrom(second, 'cellsmith.sid');
      expect(firstSid).toBeDefined();
      expect(secondSid).toBeDefined();
      expect(secondSid).not.toBe(firstSid);
      const stale = await request(t.app)
        .get('/api/auth/me')
        .set('Cookie', `cellsmith.sid=${encodeURIComponent(firstSid ?? '')}`);
      expect(stale.status).toBe(401);
      const me = await client.get('/api/auth/me');
      expect(me.body.user.email).toBe(shop.emails.operator);
    });
  });

  describe('GET /api/auth/me', () => {
    it('When nobody is signed in, then 401', async () => {
      const res = await request(t.app).get('/api/auth/me');
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('not_signed_in');
    });

    it('When signed in, then it answers the user', async () => {
      const client = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await client.get('/api/auth/me');
      expect(res.status).toBe(200);
      expect(res.body.user).toMatchObject({
        email: shop.emails.reviewer,
        roles: ['reviewer'],
        shopName: shop.name,
      });
    });
  });

  describe('POST /api/auth/logout', () => {
    it('When signed in, then 204 and the session is destroyed for good', async () => {
      const client = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const me = await client.get('/api/auth/me');
      expect(me.status).toBe(200);
      const sid = cookieFrom(
        await client.signIn(shop.emails.reviewer, TEST_PASSWORD),
        'cellsmith.sid',
      );
      const res = await client.post('/api/auth/logout');
      expect(res.status).toBe(204);
      expect((await client.get('/api/auth/me')).status).toBe(401);
      const replay = await request(t.app)
        .get('/api/auth/me')
        .set('Cookie', `cellsmith.sid=${encodeURIComponent(sid ?? '')}`);
      expect(replay.status).toBe(401);
    });

    it('When nobody is signed in, then 401', async () => {
      const client = await new ApiClient(t.app).prime();
      expect((await client.post('/api/auth/logout')).status).toBe(401);
    });
  });

  describe('unknown API paths', () => {
    it('When no route matches, then 404 in the error shape', async () => {
      const res = await request(t.app).get('/api/no-such-thing');
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    });
  });
});
