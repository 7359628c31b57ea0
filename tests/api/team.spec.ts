import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type { CapturedMail, Invitation, Member } from '../../shared/contracts/team';
import { ApiClient, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

/** The invitation link in the newest captured message to `email`. */
function invitationLinkFor(mailDir: string, email: string): string {
  const messages = readdirSync(mailDir)
    .filter((name) => name.endsWith('.json'))
    .sort()
    .map((name) => JSON.parse(readFileSync(join(mailDir, name), 'utf8')) as CapturedMail)
    .filter((mail) => mail.to.includes(email));
  const last = messages[messages.length - 1];
  const link = last?.text.match(/https?:\/\/\S+\/invitations\/([\w-]+)/);
  if (!link?.[1]) throw new Error(`no invitation mail to ${email}`);
  return link[1];
}

describe('team routes', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let admin: ApiClient;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'team');
    otherShop = await createTestShop(t.db, 'team-other');
    admin = await signedIn(t.app, shop.emails.admin, TEST_PASSWORD);
  });
  afterAll(() => t.close());

  describe('role refusal', () => {
    it.each(['tuner', 'operator', 'reviewer'] as const)(
      'When a %s lists the team, then 403',
      async (role) => {
        const client = await signedIn(t.app, shop.emails[role], TEST_PASSWORD);
        const res = await client.get('/api/team/members');
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      },
    );

    it('When a tuner invites someone, then 403 and no mail goes out', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const res = await client.post('/api/team/invitations', {
        email: 'sneaky@shop.test',
        roles: ['admin'],
      });
      expect(res.status).toBe(403);
    });

    it('When nobody is signed in, then 401', async () => {
      expect((await request(t.app).get('/api/team/members')).status).toBe(401);
    });
  });

  describe('GET /api/team/members', () => {
    it('When an admin lists members, then only their own shop is listed', async () => {
      const res = await admin.get('/api/team/members');
      expect(res.status).toBe(200);
      const emails = (res.body.items as Member[]).map((m) => m.email).sort();
      expect(emails).toEqual(Object.values(shop.emails).sort());
      expect(res.body.total).toBe(4);
    });
  });

  describe('PATCH /api/team/members/:id', () => {
    it('When an admin gives a member several roles, then they are stored', async () => {
      const id = shop.userIds[shop.emails.reviewer];
      const res = await admin.patch(`/api/team/members/${id}`, { roles: ['tuner', 'reviewer'] });
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ id, roles: ['tuner', 'reviewer'], disabled: false });
      const me = await (
        await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD)
      ).get('/api/auth/me');
      expect(me.body.user.roles).toEqual(['tuner', 'reviewer']);
    });

    it('When the member belongs to another shop, then 404 and it is untouched', async () => {
      const foreign = otherShop.userIds[otherShop.emails.tuner];
      const res = await admin.patch(`/api/team/members/${foreign}`, { roles: ['admin'] });
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      const otherAdmin = await signedIn(t.app, otherShop.emails.admin, TEST_PASSWORD);
      const list = await otherAdmin.get('/api/team/members');
      const tuner = (list.body.items as Member[]).find((m) => m.id === foreign);
      expect(tuner?.roles).toEqual(['tuner']);
    });

    it('When the roles are unknown or empty, then 400', async () => {
      const id = shop.userIds[shop.emails.tuner];
      expect((await admin.patch(`/api/team/members/${id}`, { roles: ['pilot'] })).status).toBe(400);
      expect((await admin.patch(`/api/team/members/${id}`, { roles: [] })).status).toBe(400);
      expect((await admin.patch(`/api/team/members/${id}`, {})).status).toBe(400);
      expect((await admin.patch('/api/team/members/not-a-uuid', { roles: ['tuner'] })).status).toBe(
        400,
      );
    });

    it('When an admin removes their own admin role or disables themselves, then 409', async () => {
      const self = shop.userIds[shop.emails.admin];
      expect((await admin.patch(`/api/team/members/${self}`, { roles: ['tuner'] })).status).toBe(
        409,
      );
      expect((await admin.patch(`/api/team/members/${self}`, { disabled: true })).status).toBe(409);
    });

    it('When a member is disabled, then their session ends and they cannot sign in until enabled', async () => {
      const id = shop.userIds[shop.emails.operator];
      const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      expect((await admin.patch(`/api/team/members/${id}`, { disabled: true })).body.disabled).toBe(
        true,
      );
      expect((await operator.get('/api/auth/me')).status).toBe(401);
      const again = await new ApiClient(t.app).prime();
      expect(
        (
          await again.post('/api/auth/login', {
            email: shop.emails.operator,
            password: TEST_PASSWORD,
          })
        ).status,
      ).toBe(401);
      expect(
        (await admin.patch(`/api/team/members/${id}`, { disabled: false })).body.disabled,
      ).toBe(false);
      expect(
        (
          await again.post('/api/auth/login', {
            email: shop.emails.operator,
            password: TEST_PASSWORD,
          })
        ).status,
      ).toBe(200);
    });
  });

  describe('invitations', () => {
    it('When an admin invites, then mail is captured and the invitee can accept and sign in', async () => {
      const email = `new.${Date.now()}@shop.test`;
      const created = await admin.post('/api/team/invitations', {
        email,
        name: 'Nell Newcombe',
        roles: ['operator'],
      });
      expect(created.status).toBe(201);
      expect(created.body as Invitation).toMatchObject({
        email,
        roles: ['operator'],
        status: 'pending',
      });

      const mail = await admin.get('/api/dev/mail');
      expect(mail.status).toBe(200);
      const message = (mail.body.items as CapturedMail[]).find((m) => m.to.includes(email));
      expect(message?.subject).toContain(shop.name);

      const token = invitationLinkFor(t.mailDir, email);
      const preview = await request(t.app).get(`/api/invitations/${token}`);
      expect(preview.status).toBe(200);
      expect(preview.body).toMatchObject({ email, shopName: shop.name, roles: ['operator'] });

      const visitor = await new ApiClient(t.app).prime();
      const weak = await visitor.post(`/api/invitations/${token}/accept`, {
        name: 'Nell',
        password: 'short',
      });
      expect(weak.status).toBe(400);
      const accepted = await visitor.post(`/api/invitations/${token}/accept`, {
        name: 'Nell Newcombe',
        password: 'a-long-enough-password',
      });
      expect(accepted.status).toBe(201);
      expect(accepted.body).toMatchObject({ email, name: 'Nell Newcombe', roles: ['operator'] });

      const again = await visitor.post(`/api/invitations/${token}/accept`, {
        name: 'Nell',
        password: 'another-long-password',
      });
      expect(again.status).toBe(404);

      const member = await signedIn(t.app, email, 'a-long-enough-password');
      const me = await member.get('/api/auth/me');
      expect(me.body.user).toMatchObject({ email, roles: ['operator'], shopId: shop.id });

      const list = await admin.get('/api/team/invitations');
      const inv = (list.body.items as Invitation[]).find((i) => i.email === email);
      expect(inv?.status).toBe('accepted');
    });

    it('When the e-mail already has an account, then 409', async () => {
      const res = await admin.post('/api/team/invitations', {
        email: otherShop.emails.tuner,
        roles: ['tuner'],
      });
      expect(res.status).toBe(409);
    });

    it('When an invitation is revoked, then its link stops working', async () => {
      const email = `revoked.${Date.now()}@shop.test`;
      const created = await admin.post('/api/team/invitations', { email, roles: ['reviewer'] });
      const token = invitationLinkFor(t.mailDir, email);
      expect((await admin.delete(`/api/team/invitations/${created.body.id}`)).status).toBe(204);
      expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(404);
      expect((await admin.delete(`/api/team/invitations/${created.body.id}`)).status).toBe(409);
    });

    it('When an invitation of another shop is revoked, then 404 and it stays pending', async () => {
      const otherAdmin = await signedIn(t.app, otherShop.emails.admin, TEST_PASSWORD);
      const email = `foreign.${Date.now()}@shop.test`;
      const created = await otherAdmin.post('/api/team/invitations', { email, roles: ['tuner'] });
      expect(created.status).toBe(201);
      expect((await admin.delete(`/api/team/invitations/${created.body.id}`)).status).toBe(404);
      const theirs = await otherAdmin.get('/api/team/invitations');
      expect(
        (theirs.body.items as Invitation[]).find((i) => i.id === created.body.id)?.status,
      ).toBe('pending');
      // Captured mail is per shop too.
      const ours = await admin.get('/api/dev/mail');
      expect((ours.body.items as CapturedMail[]).some((m) => m.to.includes(email))).toBe(false);
    });

    it('When a token is unknown or malformed, then 404 or 400', async () => {
      expect(
        (await request(t.app).get('/api/invitations/AAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAAA'))
          .status,
      ).toBe(404);
      expect((await request(t.app).get('/api/invitations/bad!')).status).toBe(400);
    });
  });
});
