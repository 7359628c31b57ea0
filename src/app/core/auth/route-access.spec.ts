import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, UrlTree, provideRouter } from '@angular/router';
import { areasFor } from '@shared/auth/access';
import type { SessionUser } from '@shared/contracts/auth';
import type { Role } from '@shared/contracts/roles';
import { mayOpenArea, redirectHome, requireArea, requireSignedIn } from './route-access';

/** A signed-in member of the test shop holding `roles`. */
function userWith(roles: Role[]): SessionUser {
  return {
    id: 'u1',
    email: 'member@example.test',
    name: 'Test Member',
    roles,
    shopId: 's1',
    shopName: 'Test Shop',
  };
}

describe('route access', () => {
  let http: HttpTestingController;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([])],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  /**
   * Runs a guard body in an injection context, answers the session check it waits for with
   * `user` (or a 401 for nobody), and returns the guard's result with any URL serialised.
   */
  async function runGuard(
    guard: () => Promise<boolean | UrlTree>,
    user: SessionUser | null,
  ): Promise<boolean | string> {
    const result = TestBed.runInInjectionContext(guard);
    const request = http.expectOne('/api/auth/me');
    if (user === null) {
      request.flush(
        { error: { code: 'not_signed_in', message: 'Sign in first' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    } else {
      request.flush({ user });
    }
    const outcome = await result;
    return typeof outcome === 'boolean' ? outcome : TestBed.inject(Router).serializeUrl(outcome);
  }

  describe('requireSignedIn', () => {
    it('when someone is signed in, then it lets them through', async () => {
      expect(await runGuard(() => requireSignedIn('/plans'), userWith(['tuner']))).toBe(true);
    });

    it('when nobody is signed in, then it sends them to sign in with the return URL', async () => {
      const outcome = await runGuard(() => requireSignedIn('/tables/7?rev=2'), null);

      expect(outcome).toBe('/sign-in?returnUrl=%2Ftables%2F7%3Frev%3D2');
    });
  });

  describe('requireArea', () => {
    it('when an operator opens team, then it sends them to their first area', async () => {
      const outcome = await runGuard(() => requireArea('team'), userWith(['operator']));

      expect(outcome).toBe(`/${areasFor(['operator'])[0]}`);
    });

    it('when an admin opens team, then it lets them in', async () => {
      expect(await runGuard(() => requireArea('team'), userWith(['admin']))).toBe(true);
    });

    it('when nobody is signed in, then it sends them to sign in', async () => {
      expect(await runGuard(() => requireArea('plans'), null)).toBe('/sign-in');
    });
  });

  describe('mayOpenArea', () => {
    it('when an operator opens a table, then the tables area matches (read-only)', async () => {
      expect(await runGuard(() => mayOpenArea('tables'), userWith(['operator']))).toBe(true);
    });

    it('when an admin opens a table, then the area does not match and no redirect is made', async () => {
      expect(await runGuard(() => mayOpenArea('tables'), userWith(['admin']))).toBe(false);
    });

    it('when nobody is signed in, then the area does not match', async () => {
      expect(await runGuard(() => mayOpenArea('tables'), null)).toBe(false);
    });
  });

  describe('redirectHome', () => {
    it.each<Role[][]>([[['admin']], [['operator']], [['reviewer']], [['tuner', 'admin']]])(
      'when %p signs in, then it goes to the first area of areasFor',
      async (roles) => {
        const outcome = await runGuard(() => redirectHome(), userWith(roles));

        expect(outcome).toBe(`/${areasFor(roles)[0]}`);
      },
    );

    it('when nobody is signed in, then it goes to sign in', async () => {
      expect(await runGuard(() => redirectHome(), null)).toBe('/sign-in');
    });
  });
});
