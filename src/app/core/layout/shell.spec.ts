import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { MatNavListHarness } from '@angular/material/list/testing';
import { provideRouter } from '@angular/router';
import { areasFor } from '@shared/auth/access';
import type { SessionUser } from '@shared/contracts/auth';
import type { Role } from '@shared/contracts/roles';
import { noAnimations } from '../../../testing/harness-helpers';
import { Session } from '../auth/session';
import { NAV_AREAS } from './nav-areas';
import { Shell } from './shell';

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
});
