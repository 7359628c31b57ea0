import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { Router, provideRouter } from '@angular/router';
import type { SessionUser } from '@shared/contracts/auth';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import { Session } from '../../core/auth/session';
import { SignInPage } from './sign-in-page';

/** Answers the session check the page starts with: `user` signed in, or nobody (401). */
async function answerSessionCheck(
  http: HttpTestingController,
  fixture: ComponentFixture<SignInPage>,
  user: SessionUser | null,
): Promise<void> {
  const request = http.expectOne('/api/auth/me');
  if (user === null) {
    request.flush(
      { error: { code: 'not_signed_in', message: 'Sign in first' } },
      { status: 401, statusText: 'Unauthorized' },
    );
  } else {
    request.flush({ user });
  }
  // The page reacts to this answer in a promise callback, which whenStable alone does not wait
  // for; by the time whenLoaded settles here, the page's own callback has run.
  await TestBed.inject(Session).whenLoaded();
  await fixture.whenStable();
}

const USER: SessionUser = {
  id: 'u1',
  email: 'tuner@example.test',
  name: 'Test Tuner',
  roles: ['tuner'],
  shopId: 's1',
  shopName: 'Test Shop',
};

describe('SignInPage', () => {
  let fixture: ComponentFixture<SignInPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigateByUrl: jest.SpyInstance;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('returnUrl', '/plans');
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
    await answerSessionCheck(http, fixture, null);
  });

  afterEach(() => http.verify());

  async function submit(email: string, password: string): Promise<void> {
    await fillField(loader, 'E-mail', email);
    await fillField(loader, 'Password', password);
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();
  }

  function alertText(): string {
    const alert: HTMLElement | null = fixture.nativeElement.querySelector('[role="alert"]');
    return alert?.textContent?.trim() ?? '';
  }

  it('when the credentials are right, then it signs in and goes to the return URL', async () => {
    await submit('tuner@example.test', 'correct horse');

    const request = http.expectOne('/api/auth/login');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      email: 'tuner@example.test',
      password: 'correct horse',
    });
    request.flush({ user: USER });
    await fixture.whenStable();

    expect(TestBed.inject(Session).user()).toEqual(USER);
    expect(navigateByUrl).toHaveBeenCalledWith('/plans');
  });

  it('when the server answers 401, then it shows the server message', async () => {
    await submit('tuner@example.test', 'wrong');

    http
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'not_signed_in', message: 'Wrong e-mail or password' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();

    expect(alertText()).toBe('Wrong e-mail or password');
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it('when the server answers 429, then it says how long to wait', async () => {
    await submit('tuner@example.test', 'again');

    http
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'too_many_requests', message: 'Too many attempts' } },
        { status: 429, statusText: 'Too Many Requests', headers: { 'Retry-After': '90' } },
      );
    await fixture.whenStable();

    expect(alertText()).toBe('Too many sign-in attempts. Wait 2 minutes, then try again.');
  });

  it('when the form is empty, then it sends nothing', async () => {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Sign in' }))).click();

    http.expectNone('/api/auth/login');
  });
});

describe('SignInPage before the form is shown', () => {
  let http: HttpTestingController;
  let navigateByUrl: jest.SpyInstance;

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    http = TestBed.inject(HttpTestingController);
    navigateByUrl = jest.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
  });

  afterEach(() => http.verify());

  function textOf(fixture: ComponentFixture<SignInPage>): string {
    return (fixture.nativeElement as HTMLElement).textContent ?? '';
  }

  it('when someone is already signed in, then it goes to the return URL without the form', async () => {
    const fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('returnUrl', '/plans');
    await fixture.whenStable();
    expect(fixture.nativeElement.querySelector('form')).toBeNull();

    await answerSessionCheck(http, fixture, USER);

    expect(navigateByUrl).toHaveBeenCalledWith('/plans', { replaceUrl: true });
    expect(fixture.nativeElement.querySelector('form')).toBeNull();
  });

  it('when someone is already signed in and the return URL is foreign, then it goes to /', async () => {
    const fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('returnUrl', 'https://evil.example/');
    await fixture.whenStable();

    await answerSessionCheck(http, fixture, USER);

    expect(navigateByUrl).toHaveBeenCalledWith('/', { replaceUrl: true });
  });

  it('when nobody is signed in, then it shows the form and stays', async () => {
    const fixture = TestBed.createComponent(SignInPage);
    await fixture.whenStable();
    expect(textOf(fixture)).toContain('Checking whether you are signed in');

    await answerSessionCheck(http, fixture, null);

    expect(fixture.nativeElement.querySelector('form')).not.toBeNull();
    expect(textOf(fixture)).not.toContain('Checking whether you are signed in');
    expect(navigateByUrl).not.toHaveBeenCalled();
  });

  it('pre-fills the e-mail field from the email query parameter', async () => {
    const fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('email', 'new@example.test');
    await fixture.whenStable();
    await answerSessionCheck(http, fixture, null);

    const input: HTMLInputElement = fixture.nativeElement.querySelector('input[type="email"]');
    expect(input.value).toBe('new@example.test');
  });
});
