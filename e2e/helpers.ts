import { expect, type APIRequestContext, type Page } from '@playwright/test';

export const DEMO_PASSWORD = 'camber-demo-2026';

export async function signInAs(page: Page, email: string): Promise<void> {
  await page.goto('/login');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
}

/** Readings of a piece as the server has them, read through the API with its own session. */
export async function serverReadings(request: APIRequestContext, pieceId: string): Promise<Array<{ note: string | null; valueMm: number; hasPhoto: boolean }>> {
  const login = await request.post('/api/auth/login', { data: { email: 'qc@ridgeback.example', password: DEMO_PASSWORD } });
  expect(login.ok()).toBe(true);
  const res = await request.get(`/api/pieces/${pieceId}`);
  return (await res.json()).readings;
}
