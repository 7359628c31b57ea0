import type { Page } from 'playwright-core';

/** Opens the Team page from the navigation. */
export async function openTeam(page: Page): Promise<void> {
  await page.getByRole('navigation').getByRole('link', { name: 'Team' }).click();
  await page.getByRole('button', { name: 'Invite member' }).waitFor();
}

/** Invites someone through the invite dialog. */
export async function inviteMember(
  page: Page,
  email: string,
  name: string,
  roles: string[],
): Promise<void> {
  await page.getByRole('button', { name: 'Invite member' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('E-mail').fill(email);
  await dialog.getByLabel('Name').fill(name);
  for (const role of roles)
    await dialog.getByRole('checkbox', { name: role, exact: false }).check();
  await dialog.getByRole('button', { name: 'Send invitation' }).click();
  await dialog.waitFor({ state: 'detached' });
}

/** Opens the captured message to `email` on the Team page and returns the invitation link in it. */
export async function readInvitationLink(page: Page, email: string): Promise<string> {
  const item = page.getByText(email).last();
  await item.waitFor();
  await page
    .getByRole('button', { name: /invited to join/i })
    .first()
    .click();
  const link = page.getByRole('link', { name: /\/invitations\// }).first();
  await link.waitFor();
  const href = await link.getAttribute('href');
  if (!href) throw new Error('the captured message has no invitation link');
  return href;
}

/** Accepts an invitation on its page with a name and a new password. */
export async function acceptInvitation(
  page: Page,
  link: string,
  name: string,
  password: string,
): Promise<void> {
  await page.goto(link);
  await page.getByLabel('Your name').fill(name);
  await page.getByLabel('New password').fill(password);
  await page.getByLabel('Repeat password').fill(password);
  await page.getByRole('button', { name: 'Accept invitation' }).click();
  await page.getByRole('button', { name: 'Sign in' }).waitFor();
}
