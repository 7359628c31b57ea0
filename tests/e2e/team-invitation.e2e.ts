import { demoPassword } from '../../server/seed/demo-shop';
import { navigationLinks, signInThroughForm, signOutThroughMenu } from './helpers/auth';
import { acceptInvitation, inviteMember, openTeam, readInvitationLink } from './helpers/team';
import { startRunningApp, type RunningApp } from './support/app-server';
import { launchBrowser, screenshot, type TestBrowser } from './support/browser';

describe('inviting a member', () => {
  let app: RunningApp;
  let browser: TestBrowser;

  beforeAll(async () => {
    app = await startRunningApp();
    browser = await launchBrowser('dark');
  });
  afterAll(async () => {
    await browser?.close();
    await app?.close();
  });

  it('When an admin invites an operator, then the operator accepts from the mail and signs in', async () => {
    const page = await browser.newPage();
    const email = `operator.${Date.now()}@cellsmith.test`;
    const password = 'a-brand-new-password';

    await signInThroughForm(page, app.url, 'admin@cellsmith.test', demoPassword());
    await openTeam(page);
    await screenshot(page, 'team');
    await inviteMember(page, email, 'Ivo Newhall', ['operator']);
    await page.getByText(email).first().waitFor();
    await screenshot(page, 'team-invited');

    const link = await readInvitationLink(page, email);
    expect(link.startsWith(`${app.url}/invitations/`)).toBe(true);
    await screenshot(page, 'team-captured-mail');
    await signOutThroughMenu(page);

    await page.goto(link);
    await page.getByText(email).first().waitFor();
    await screenshot(page, 'invitation');
    await acceptInvitation(page, link, 'Ivo Newhall', password);

    await signInThroughForm(page, app.url, email, password);
    expect(await navigationLinks(page)).toEqual(['Vehicles', 'Logs', 'Plans']);
    await screenshot(page, 'new-member-signed-in');
    expect(browser.problems.filter((p) => !/401|Unauthorized/.test(p))).toEqual([]);
    await page.close();
  });
});
