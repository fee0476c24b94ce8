import { expect, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'camber-demo-2026';

export async function signInAs(page: Page, email: string): Promise<void> {
  await page.goto('/login');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('heading', { name: 'Pieces' })).toBeVisible();
}
