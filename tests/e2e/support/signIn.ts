import type { BrowserContext, Page } from 'playwright-core';

/** A new page of `context`, signed in through the sign-in form at `baseUrl`, on the role's landing page (a student's programs, an instructor's class overview, the admin console). */
export async function signInThroughPage(context: BrowserContext, baseUrl: string, account: { email: string; password: string }): Promise<Page> {
  const page = await context.newPage();
  await page.goto(`${baseUrl}/sign-in`, { waitUntil: 'networkidle' });
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password').fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/(programs|overview|admin)$/);
  return page;
}
