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

describe('SignInPage with an email query parameter', () => {
  it('pre-fills the e-mail field', async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    const fixture = TestBed.createComponent(SignInPage);
    fixture.componentRef.setInput('email', 'new@example.test');
    await fixture.whenStable();

    const input: HTMLInputElement = fixture.nativeElement.querySelector('input[type="email"]');
    expect(input.value).toBe('new@example.test');
  });
});
