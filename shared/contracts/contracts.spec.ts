import { loginRequestSchema, newPasswordSchema } from './auth';
import { isApiErrorBody } from './errors';
import { rolesSchema } from './roles';
import { createInvitationRequestSchema, updateMemberRequestSchema } from './team';

describe('contracts', () => {
  it('accepts a sign-in body and refuses a bad e-mail', () => {
    expect(loginRequestSchema.safeParse({ email: 'a@b.test', password: 'x' }).success).toBe(true);
    expect(loginRequestSchema.safeParse({ email: 'ab.test', password: 'x' }).success).toBe(false);
    expect(loginRequestSchema.safeParse({ email: 'a@b.test', password: '' }).success).toBe(false);
  });

  it('asks for a password of at least 10 characters', () => {
    expect(newPasswordSchema.safeParse('123456789').success).toBe(false);
    expect(newPasswordSchema.safeParse('1234567890').success).toBe(true);
  });

  it('refuses empty, unknown or repeated roles', () => {
    expect(rolesSchema.safeParse(['tuner', 'reviewer']).success).toBe(true);
    expect(rolesSchema.safeParse([]).success).toBe(false);
    expect(rolesSchema.safeParse(['pilot']).success).toBe(false);
    expect(rolesSchema.safeParse(['tuner', 'tuner']).success).toBe(false);
  });

  it('needs roles or disabled in a member update, and nothing else', () => {
    expect(updateMemberRequestSchema.safeParse({ disabled: true }).success).toBe(true);
    expect(updateMemberRequestSchema.safeParse({}).success).toBe(false);
    expect(updateMemberRequestSchema.safeParse({ roles: ['admin'], email: 'x@y.z' }).success).toBe(
      false,
    );
  });

  it('needs an e-mail and roles in an invitation', () => {
    expect(
      createInvitationRequestSchema.safeParse({ email: 'a@b.test', roles: ['operator'] }).success,
    ).toBe(true);
    expect(createInvitationRequestSchema.safeParse({ email: 'a@b.test' }).success).toBe(false);
  });

  it('recognises the API error shape', () => {
    expect(isApiErrorBody({ error: { code: 'not_found', message: 'x' } })).toBe(true);
    expect(isApiErrorBody({ error: 'x' })).toBe(false);
    expect(isApiErrorBody(null)).toBe(false);
  });
});
