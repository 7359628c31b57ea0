import type { Page } from 'playwright-core';

/** Signs in through the sign-in form and waits for the shell. */
export async function signInThroughForm(
  page: Page,
  baseUrl: string,
  email: string,
  password: string,
): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Account' }).waitFor();
}

/** Signs out through the account menu and waits for the sign-in page. */
export async function signOutThroughMenu(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Account' }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.getByRole('button', { name: 'Sign in' }).waitFor();
}

/** The accessible names of the side navigation's links, in order (icons are aria-hidden). */
export async function navigationLinks(page: Page): Promise<string[]> {
  const snapshot = await page.getByRole('navigation').ariaSnapshot();
  return [...snapshot.matchAll(/- link "([^"]+)"/g)].map((match) => match[1] ?? '');
}
