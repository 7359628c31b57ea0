import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatActionListHarness } from '@angular/material/list/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
import { MatTableHarness } from '@angular/material/table/testing';
import { provideRouter } from '@angular/router';
import type { CapturedMail, Invitation, Member } from '@shared/contracts/team';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import { TeamPage } from './team-page';

const MEMBERS: Member[] = [
  {
    id: 'm1',
    email: 'ada@example.test',
    name: 'Ada Admin',
    roles: ['admin'],
    disabled: false,
    joinedAt: '2026-01-05T10:00:00.000Z',
  },
  {
    id: 'm2',
    email: 'tom@example.test',
    name: 'Tom Tuner',
    roles: ['tuner'],
    disabled: false,
    joinedAt: '2026-02-07T10:00:00.000Z',
  },
];

const INVITATION: Invitation = {
  id: 'i1',
  email: 'new@example.test',
  name: null,
  roles: ['operator'],
  status: 'pending',
  invitedBy: 'm1',
  createdAt: '2026-03-01T10:00:00.000Z',
  expiresAt: '2026-03-08T10:00:00.000Z',
};

const MAIL: CapturedMail = {
  id: 'mail1',
  to: ['new@example.test'],
  from: 'no-reply@example.test',
  subject: 'You are invited to Test Shop',
  receivedAt: '2026-03-01T10:00:01.000Z',
  text: 'Accept here: http://localhost:4000/invitations/tok_123.\nThanks',
};

describe('TeamPage', () => {
  let fixture: ComponentFixture<TeamPage>;
  let loader: HarnessLoader;
  let rootLoader: HarnessLoader;
  let http: HttpTestingController;

  async function createPage(mailCapture: boolean): Promise<void> {
    fixture = TestBed.createComponent(TeamPage);
    loader = TestbedHarnessEnvironment.loader(fixture);
    rootLoader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    fixture.detectChanges();
    http.expectOne('/api/team/members').flush({ items: MEMBERS, total: MEMBERS.length });
    http.expectOne('/api/team/invitations').flush({ items: [], total: 0 });
    http.expectOne('/api/meta').flush({ mailCapture, version: 'test' });
    if (mailCapture) http.expectOne('/api/dev/mail').flush({ items: [MAIL], total: 1 });
    await fixture.whenStable();
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting(), provideRouter([]), noAnimations],
    });
    http = TestBed.inject(HttpTestingController);
  });

  afterEach(() => http.verify());

  it('lists the members', async () => {
    await createPage(false);

    const table = await loader.getHarness(MatTableHarness);
    const rows = await table.getCellTextByColumnName();
    expect(rows['name'].text).toEqual(['Ada Admin', 'Tom Tuner']);
    expect(rows['email'].text).toEqual(['ada@example.test', 'tom@example.test']);
    expect((fixture.nativeElement as HTMLElement).textContent).not.toContain('Captured mail');
  });

  it('when a role is added, then it PATCHes the member with the new roles', async () => {
    await createPage(false);
    const selects = await loader.getAllHarnesses(MatSelectHarness);

    await selects[1].open();
    await selects[1].clickOptions({ text: 'Reviewer' });

    const request = http.expectOne('/api/team/members/m2');
    expect(request.request.method).toBe('PATCH');
    expect(request.request.body).toEqual({ roles: ['tuner', 'reviewer'] });
    request.flush({ ...MEMBERS[1], roles: ['tuner', 'reviewer'] });
  });

  it('when the server refuses a change, then it shows the server message', async () => {
    await createPage(false);
    const selects = await loader.getAllHarnesses(MatSelectHarness);

    await selects[0].open();
    await selects[0].clickOptions({ text: 'Tuner' });
    http
      .expectOne('/api/team/members/m1')
      .flush(
        { error: { code: 'conflict', message: 'You cannot remove your own admin role' } },
        { status: 409, statusText: 'Conflict' },
      );
    await fixture.whenStable();

    expect(document.body.textContent).toContain('You cannot remove your own admin role');
  });

  it('when the invite dialog is sent, then it POSTs the invitation and reloads the lists', async () => {
    await createPage(true);

    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite member/ }))).click();
    const dialog = await rootLoader.getHarness(MatDialogHarness);
    await fillField(dialog, 'E-mail', 'new@example.test');
    await (await dialog.getHarness(MatCheckboxHarness.with({ label: 'Operator' }))).check();
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send invitation' }))).click();

    const request = http.expectOne('/api/team/invitations');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({ email: 'new@example.test', roles: ['operator'] });
    request.flush(INVITATION, { status: 201, statusText: 'Created' });
    await fixture.whenStable();

    http
      .expectOne({ method: 'GET', url: '/api/team/invitations' })
      .flush({ items: [INVITATION], total: 1 });
    http.expectOne('/api/dev/mail').flush({ items: [MAIL], total: 1 });
    await fixture.whenStable();
    expect(await rootLoader.getAllHarnesses(MatDialogHarness)).toHaveLength(0);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain('new@example.test');
  });

  it('when no role is ticked, then the dialog sends nothing', async () => {
    await createPage(false);

    await (await loader.getHarness(MatButtonHarness.with({ text: /Invite member/ }))).click();
    const dialog = await rootLoader.getHarness(MatDialogHarness);
    await fillField(dialog, 'E-mail', 'new@example.test');
    await (await dialog.getHarness(MatButtonHarness.with({ text: 'Send invitation' }))).click();

    http.expectNone('/api/team/invitations');
    expect(await dialog.getText()).toContain('Choose at least one role.');
  });

  it('when mail is captured, then a message opens with its link as an anchor', async () => {
    await createPage(true);

    const list = await loader.getHarness(MatActionListHarness);
    const [item] = await list.getItems();
    expect(await item.getTitle()).toBe(MAIL.subject);
    await item.click();

    const link: HTMLAnchorElement = fixture.nativeElement.querySelector('.message-body a');
    expect(link.getAttribute('href')).toBe('http://localhost:4000/invitations/tok_123');
    expect(fixture.nativeElement.querySelector('.message-body').textContent).toBe(MAIL.text);
  });
});
