import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

const note = `e2e check north stem ${Date.now()}`;

test('an inspector finds a piece in the office list, logs a reading and sees it in the readings table', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await page.getByRole('link', { name: 'Pieces' }).click();
  await page.getByLabel('Status').selectOption('in_storage');
  await page.getByLabel('Find by mark').fill('dt-1');
  // Wait for the filtered list (the previous page stays visible while the next one loads).
  await expect(page.getByRole('table').getByRole('row').nth(1)).toContainText('In storage');
  await expect(page.getByRole('table').getByRole('row').nth(1)).toContainText('DT-1');
  const first = page.getByRole('table').getByRole('link').first();
  const mark = (await first.textContent())!;
  await first.click();
  await expect(page.getByRole('heading', { name: mark, level: 1 })).toBeVisible();

  await page.getByRole('textbox', { name: /^Camber/ }).fill('1-3/8"');
  await expect(page.getByText('Understood as 1 3/8 in = 34.9 mm')).toBeVisible();
  await page.getByRole('group', { name: 'Sky' }).getByText('Overcast').click();
  await page.getByLabel('Note').fill(note);
  await page.getByRole('button', { name: 'Save the reading' }).click();
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent');
  const row = page.getByRole('row').filter({ hasText: note });
  await expect(row).toHaveCount(1);
  await expect(row).toContainText('1 3/8 in');
  await expect(row).toContainText('Dana Ortiz');
});

test('a reading the parser cannot understand is refused with the reason, before anything is sent', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await page.getByRole('link', { name: 'Pieces' }).click();
  await page.getByLabel('Status').selectOption('in_storage');
  await expect(page.getByRole('table').getByRole('row').nth(1)).toContainText('In storage');
  await page.getByRole('table').getByRole('link').first().click();
  await page.getByRole('textbox', { name: /^Camber/ }).fill('1 3/7');
  await expect(page.getByText(/sixteenths, not \/7/)).toBeVisible();
});
