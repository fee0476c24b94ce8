import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('a QC manager reviews a flagged piece, sees its chart, holds it with a comment, and it leaves "needs a decision"', async ({ page }) => {
  await signInAs(page, 'qc@ridgeback.example');
  await expect(page.getByRole('heading', { name: /Yard board/ })).toBeVisible();
  await page.getByRole('link', { name: 'Open the review list' }).click();
  await expect(page.getByRole('heading', { name: 'Review list' })).toBeVisible();
  const first = page.getByRole('table').getByRole('row').nth(1);
  const mark = (await first.getByRole('link').first().textContent())!;
  await first.getByRole('link', { name: mark }).click();
  await expect(page.getByRole('heading', { name: mark, level: 1 })).toBeVisible();
  await expect(page.getByRole('img', { name: /Camber against age/ })).toBeVisible();
  await expect(page.getByRole('region', { name: 'Flags' }).getByRole('listitem').first()).toBeVisible();

  await page.getByRole('group', { name: 'Decision' }).getByText('Hold').click();
  await page.getByRole('button', { name: 'Save the decision' }).click();
  await expect(page.getByRole('alert')).toContainText('needs a comment');
  await page.getByLabel(/^Comment/).fill('Re-measure at dawn before the truck is loaded');
  await page.getByRole('button', { name: 'Save the decision' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Decision recorded' })).toBeVisible();
  await expect(page.getByRole('region', { name: 'Decisions' })).toContainText('Re-measure at dawn');

  await page.getByRole('link', { name: 'Review' }).click();
  await expect(page.getByRole('heading', { name: 'Review list' })).toBeVisible();
  await expect(page.getByRole('table').getByRole('link', { name: mark, exact: true })).toHaveCount(0);
  await page.getByRole('tab', { name: 'All flagged pieces' }).click();
  await expect(page.getByRole('table').getByRole('link', { name: mark, exact: true })).toHaveCount(1);
});
