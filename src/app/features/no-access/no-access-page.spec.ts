import { ChangeDetectionStrategy, Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { Router, provideRouter, withComponentInputBinding } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import type { Role } from '@shared/contracts/roles';
import { Session } from '../../core/auth/session';
import { mayOpenArea } from '../../core/auth/route-access';
import { NoAccessPage, roleList } from './no-access-page';

/** Stands in for the tables area's pages. */
@Component({
  selector: 'app-tables-stand-in',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: 'the table',
})
class TablesStandIn {}

/** Opens `url` as a member holding `roles`, through the same route pair as `app.routes.ts`. */
async function openAs(roles: Role[], url: string): Promise<RouterTestingHarness> {
  const user = { id: 'u1', name: 'Some One', roles };
  TestBed.configureTestingModule({
    providers: [
      {
        provide: Session,
        useValue: {
          user: signal(user),
          homePath: signal('/vehicles'),
          whenLoaded: () => Promise.resolve(user),
        },
      },
      provideRouter(
        [
          {
            path: 'tables',
            canMatch: [() => mayOpenArea('tables')],
            children: [{ path: '**', component: TablesStandIn }],
          },
          {
            path: 'tables',
            children: [{ path: '**', component: NoAccessPage, data: { area: 'tables' } }],
          },
        ],
        withComponentInputBinding(),
      ),
    ],
  });
  const harness = await RouterTestingHarness.create();
  await harness.navigateByUrl(url);
  return harness;
}

describe('NoAccessPage', () => {
  it('When an admin opens a table, then the address stays and the page says the role cannot open it', async () => {
    const harness = await openAs(['admin'], '/tables/7');
    const text = (harness.routeNativeElement as HTMLElement).textContent ?? '';

    expect(TestBed.inject(Router).url).toBe('/tables/7');
    expect(text).toContain('Your role cannot open Tables');
    expect(text).toContain('open to the roles Tuner, Operator and Reviewer');
    expect(text).toContain('you are signed in as Admin');
  });

  it('When an operator opens a table, then the table opens', async () => {
    const harness = await openAs(['operator'], '/tables/7');

    expect((harness.routeNativeElement as HTMLElement).textContent).toContain('the table');
  });

  it('When roles are listed, then they read in form order as words', () => {
    expect(roleList(['reviewer', 'tuner'])).toBe('Tuner and Reviewer');
    expect(roleList([])).toBe('no role');
  });
});
