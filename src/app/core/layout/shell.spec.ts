import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatNavListHarness } from '@angular/material/list/testing';
import { MatMenuHarness } from '@angular/material/menu/testing';
import { provideRouter } from '@angular/router';
import { areasFor } from '@shared/auth/access';
import type { SessionUser } from '@shared/contracts/auth';
import type { DisplayPreferenceValues } from '@shared/contracts/preferences';
import type { Role } from '@shared/contracts/roles';
import { noAnimations } from '../../../testing/harness-helpers';
import { Session } from '../auth/session';
import { DisplayPreferences } from '../preferences/display-preferences';
import { NAV_AREAS } from './nav-areas';
import { Shell } from './shell';

/** What the server answers for the signed-in user's display preferences. */
const STORED_PREFERENCES: DisplayPreferenceValues = {
  units: 'metric',
  mixture: 'lambda',
  theme: 'light',
};

/** Signs a user with `roles` in through the real Session and returns the shell's nav titles. */
async function navTitlesFor(roles: Role[]): Promise<string[]> {
  TestBed.configureTestingModule({
    providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
  });
  const user: SessionUser = {
    id: 'u1',
    email: 'someone@example.test',
    name: 'Some One',
    roles,
    shopId: 's1',
    shopName: 'Test Shop',
  };
  TestBed.inject(Session).signIn(user.email, 'pw').subscribe();
  TestBed.inject(HttpTestingController).expectOne('/api/auth/login').flush({ user });

  const fixture = TestBed.createComponent(Shell);
  // The shell's preferences load once someone is signed in; the page is stable after that.
  TestBed.tick();
  TestBed.inject(HttpTestingController).expectOne('/api/me/preferences').flush(STORED_PREFERENCES);
  const loader = TestbedHarnessEnvironment.loader(fixture);
  const nav = await loader.getHarness(MatNavListHarness);
  const items = await nav.getItems();
  return Promise.all(items.map((item) => item.getTitle()));
}

describe('Shell', () => {
  it('shows Team to an admin', async () => {
    expect(await navTitlesFor(['admin'])).toEqual(['Vehicles', 'Team']);
  });

  it('hides Team from a dyno operator', async () => {
    const titles = await navTitlesFor(['operator']);

    expect(titles).not.toContain('Team');
    expect(titles).toEqual(['Vehicles', 'Logs', 'Plans']);
  });

  it.each<Role[][]>([[['tuner']], [['reviewer']], [['tuner', 'reviewer', 'admin']]])(
    'shows %p exactly the areas of areasFor, in order',
    async (roles) => {
      const expected = areasFor(roles).map((area) => NAV_AREAS[area].label);

      expect(await navTitlesFor(roles)).toEqual(expected);
    },
  );

  it('shows the shop name in the toolbar', async () => {
    await navTitlesFor(['tuner']);
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();

    expect((fixture.nativeElement as HTMLElement).textContent).toContain('Test Shop');
  });

  describe('display preferences in the account menu', () => {
    const PREFS_URL = '/api/me/preferences';

    /** Signs a tuner in, answers the stored preferences and opens the account menu. */
    async function openAccountMenu(): Promise<{
      menu: MatMenuHarness;
      http: HttpTestingController;
    }> {
      await navTitlesFor(['tuner']);
      const http = TestBed.inject(HttpTestingController);
      const fixture = TestBed.createComponent(Shell);
      await fixture.whenStable();
      const loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
      const menu = await loader.getHarness(
        MatMenuHarness.with({ selector: '[aria-label="Account"]' }),
      );
      await menu.open();
      return { menu, http };
    }

    /** The labels of the checked radio items of the open menu (without the icon's name). */
    async function checkedItems(menu: MatMenuHarness): Promise<string[]> {
      const items = await menu.getItems();
      const checked: string[] = [];
      for (const item of items) {
        const host = await item.host();
        if ((await host.getAttribute('aria-checked')) === 'true') {
          checked.push((await item.getText()).replace(/^radio_button_(un)?checked/, ''));
        }
      }
      return checked;
    }

    it('shows the stored units, mixture and scheme as the checked choices', async () => {
      const { menu } = await openAccountMenu();

      expect(await checkedItems(menu)).toEqual(['Metric (kPa, °C, L, mm)', 'Lambda (λ)', 'Light']);
    });

    it('saves imperial units from the menu and keeps the menu open for the next choice', async () => {
      const { menu, http } = await openAccountMenu();
      const [imperial] = await menu.getItems({ text: /Imperial/ });
      await imperial?.click();

      const request = http.expectOne({ method: 'PATCH', url: PREFS_URL });
      expect(request.request.body).toEqual({ units: 'imperial' });
      request.flush({ units: 'imperial', mixture: 'lambda', theme: 'light' });
      expect(await menu.isOpen()).toBe(true);
      expect(TestBed.inject(DisplayPreferences).units()).toBe('imperial');
      expect(await checkedItems(menu)).toEqual([
        'Imperial (psi, °F, ci, in)',
        'Lambda (λ)',
        'Light',
      ]);

      const [afr] = await menu.getItems({ text: /AFR/ });
      await afr?.click();
      expect(http.expectOne({ method: 'PATCH', url: PREFS_URL }).request.body).toEqual({
        mixture: 'afr',
      });
    });

    it('has no separate colour-scheme button any more: the account menu is the one place', async () => {
      await navTitlesFor(['tuner']);
      const fixture = TestBed.createComponent(Shell);
      await fixture.whenStable();
      const host = fixture.nativeElement as HTMLElement;

      expect(host.querySelector('[aria-label="Colour scheme"]')).toBeNull();
      expect(host.querySelectorAll('.toolbar [mat-icon-button]').length).toBe(1);
    });
  });
});
