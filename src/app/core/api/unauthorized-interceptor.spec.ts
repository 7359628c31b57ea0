import { HttpClient, provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter } from '@angular/router';
import type { SessionUser } from '@shared/contracts/auth';
import { Session } from '../auth/session';
import { unauthorizedInterceptor } from './unauthorized-interceptor';

const USER: SessionUser = {
  id: 'u1',
  email: 'admin@example.test',
  name: 'Test Admin',
  roles: ['admin'],
  shopId: 's1',
  shopName: 'Test Shop',
};

const UNAUTHORIZED = { status: 401, statusText: 'Unauthorized' };
const NOT_SIGNED_IN = { error: { code: 'not_signed_in', message: 'Sign in first' } };

describe('unauthorizedInterceptor', () => {
  let http: HttpTestingController;
  let client: HttpClient;
  let session: Session;
  let navigate: jest.SpyInstance;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [
        provideHttpClient(withInterceptors([unauthorizedInterceptor])),
        provideHttpClientTesting(),
        provideRouter([]),
      ],
    });
    http = TestBed.inject(HttpTestingController);
    client = TestBed.inject(HttpClient);
    session = TestBed.inject(Session);
    const router = TestBed.inject(Router);
    navigate = jest.spyOn(router, 'navigate').mockResolvedValue(true);
    // The page the user is on when the request fails; the router itself has not navigated.
    jest.spyOn(router, 'url', 'get').mockReturnValue('/team?tab=invitations');

    session.signIn(USER.email, 'pw').subscribe();
    http.expectOne('/api/auth/login').flush({ user: USER });
  });

  afterEach(() => http.verify());

  /** Sends a GET to `url` and returns whatever status the caller's error callback saw. */
  function getAndCollectErrorStatus(url: string): { status: number | null } {
    const seen: { status: number | null } = { status: null };
    client.get(url).subscribe({
      error: (error: { status: number }) => (seen.status = error.status),
    });
    return seen;
  }

  it('when an API call answers 401, then it signs out and goes to sign-in with returnUrl', () => {
    const seen = getAndCollectErrorStatus('/api/team/members');

    http.expectOne('/api/team/members').flush(NOT_SIGNED_IN, UNAUTHORIZED);

    expect(session.user()).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], {
      queryParams: { returnUrl: '/team?tab=invitations' },
    });
    expect(seen.status).toBe(401);
  });

  it.each(['/api/auth/me', '/api/auth/login'])(
    'when %s answers 401, then it leaves the handling to the caller',
    (url) => {
      const seen = getAndCollectErrorStatus(url);

      http.expectOne(url).flush(NOT_SIGNED_IN, UNAUTHORIZED);

      expect(navigate).not.toHaveBeenCalled();
      expect(session.user()).toEqual(USER);
      expect(seen.status).toBe(401);
    },
  );

  it('when the user is already on the sign-in page, then it does not navigate again', () => {
    jest.spyOn(TestBed.inject(Router), 'url', 'get').mockReturnValue('/sign-in?returnUrl=%2Fteam');
    const seen = getAndCollectErrorStatus('/api/team/members');

    http.expectOne('/api/team/members').flush(NOT_SIGNED_IN, UNAUTHORIZED);

    expect(session.user()).toBeNull();
    expect(navigate).not.toHaveBeenCalled();
    expect(seen.status).toBe(401);
  });

  it('when an API call fails otherwise, then it keeps the session and passes the error on', () => {
    const seen = getAndCollectErrorStatus('/api/team/members');

    http
      .expectOne('/api/team/members')
      .flush(
        { error: { code: 'forbidden', message: 'Admins only' } },
        { status: 403, statusText: 'Forbidden' },
      );

    expect(session.user()).toEqual(USER);
    expect(navigate).not.toHaveBeenCalled();
    expect(seen.status).toBe(403);
  });
});
