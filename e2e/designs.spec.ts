import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('an engineer sets up a new product design and sees its prediction while typing', async ({ page }) => {
  const code = `BM-${Date.now() % 100000}`;
  await signInAs(page, 'engineer@ridgeback.example');
  await page.getByRole('link', { name: 'Designs' }).click();
  await page.getByRole('link', { name: 'New design' }).click();
  await expect(page.getByRole('status').filter({ hasText: /Release: prestress/ })).toBeVisible();
  await page.getByLabel('Code').fill(code);
  await page.getByLabel('Name').fill('Spandrel beam 24 in, 30 ft');
  const before = await page.getByRole('status').filter({ hasText: /Release: prestress/ }).textContent();
  await page.getByLabel('Count').first().fill('12');
  await page.getByLabel('Count').first().blur();
  await expect(page.getByRole('status').filter({ hasText: /Release: prestress/ })).not.toHaveText(before!);
  await page.getByLabel('Count').first().fill('');
  await expect(page.getByRole('status').filter({ hasText: /Not yet complete/ })).toBeVisible();
  await page.getByLabel('Count').first().fill('10');
  await page.getByRole('button', { name: 'Create the design' }).click();
  await expect(page.getByRole('heading', { name: 'Member designs' })).toBeVisible();
  await expect(page.getByRole('row').filter({ hasText: code })).toContainText('Spandrel beam');
});
