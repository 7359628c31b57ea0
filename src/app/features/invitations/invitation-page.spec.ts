import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { Router, provideRouter } from '@angular/router';
import type { InvitationPreview } from '@shared/contracts/team';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import { InvitationPage } from './invitation-page';

const TOKEN = 'tok_abcdefghijklmnopqrstuvwxyz';

const PREVIEW: InvitationPreview = {
  email: 'operator@example.test',
  name: null,
  roles: ['operator'],
  shopName: 'Test Shop',
  expiresAt: '2030-01-01T00:00:00.000Z',
};

describe('InvitationPage', () => {
  let fixture: ComponentFixture<InvitationPage>;
  let loader: HarnessLoader;
  let http: HttpTestingController;
  let navigate: jest.SpyInstance;

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    http = TestBed.inject(HttpTestingController);
    navigate = jest.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    fixture = TestBed.createComponent(InvitationPage);
    fixture.componentRef.setInput('token', TOKEN);
    loader = TestbedHarnessEnvironment.loader(fixture);
    fixture.detectChanges();
  });

  afterEach(() => http.verify());

  function text(): string {
    return (fixture.nativeElement as HTMLElement).textContent ?? '';
  }

  async function loadPreview(): Promise<void> {
    http.expectOne(`/api/invitations/${TOKEN}`).flush(PREVIEW);
    await fixture.whenStable();
  }

  async function accept(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Accept invitation' }))).click();
  }

  it('shows the shop, the address and the roles', async () => {
    await loadPreview();

    expect(text()).toContain('Join Test Shop');
    expect(text()).toContain('operator@example.test');
    expect(text()).toContain('Operator');
  });

  it('when the passwords differ, then it says so and sends nothing', async () => {
    await loadPreview();
    await fillField(loader, 'Your name', 'Olive Operator');
    await fillField(loader, 'New password', 'long enough pass');
    await fillField(loader, 'Repeat password', 'long enough pasS');

    await accept();

    http.expectNone(`/api/invitations/${TOKEN}/accept`);
    expect(text()).toContain('The passwords do not match.');
  });

  it('when the form is complete, then it posts and goes to sign in with the address', async () => {
    await loadPreview();
    await fillField(loader, 'Your name', 'Olive Operator');
    await fillField(loader, 'New password', 'long enough pass');
    await fillField(loader, 'Repeat password', 'long enough pass');

    await accept();

    const request = http.expectOne(`/api/invitations/${TOKEN}/accept`);
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ name: 'Olive Operator', password: 'long enough pass' });
    request.flush(
      {
        id: 'm1',
        email: PREVIEW.email,
        name: 'Olive Operator',
        roles: ['operator'],
        disabled: false,
        joinedAt: '2026-01-01',
      },
      { status: 201, statusText: 'Created' },
    );
    await fixture.whenStable();

    expect(navigate).toHaveBeenCalledWith(['/sign-in'], {
      queryParams: { email: 'operator@example.test' },
    });
  });

  it('when the token is unknown, then it says the invitation is no longer valid', async () => {
    http
      .expectOne(`/api/invitations/${TOKEN}`)
      .flush(
        { error: { code: 'not_found', message: 'invitation not found' } },
        { status: 404, statusText: 'Not Found' },
      );
    await fixture.whenStable();

    expect(text()).toContain('This invitation is no longer valid');
    expect(
      await loader.getAllHarnesses(MatButtonHarness.with({ text: 'Accept invitation' })),
    ).toHaveLength(0);
  });
});
