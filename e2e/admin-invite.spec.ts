import { expect, test } from '@playwright/test';
import { E2E_MAIL_WEB_PORT } from './playwright.config';
import { signInAs } from './helpers';

test('an admin invites a user and the invitation e-mail arrives', async ({ page, request }) => {
  const email = `new-engineer-${Date.now()}@ridgeback.example`;
  await signInAs(page, 'admin@ridgeback.example');
  await page.getByRole('link', { name: 'Users' }).click();
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Name').fill('Alex Planner');
  await page.getByLabel('Role', { exact: true }).selectOption('engineer');
  await page.getByRole('button', { name: 'Send the invitation' }).click();
  await expect(page.getByRole('status')).toContainText(`Invitation sent to ${email}`);
  await expect(page.getByRole('row').filter({ hasText: email })).toContainText('Invited');

  await expect
    .poll(async () => {
      const mails = (await (await request.get(`http://127.0.0.1:${E2E_MAIL_WEB_PORT}/api/email`)).json()) as Array<{ subject: string; to: Array<{ address: string }> }>;
      return mails.find((m) => m.to.some((t) => t.address === email))?.subject ?? null;
    })
    .toMatch(/invited to Crownwatch/);
});

test('a viewer signs in and sees only the pieces of their job', async ({ page }) => {
  await signInAs(page, 'viewer@ridgeback.example');
  const jobCells = page.getByRole('table').getByRole('row').locator('td:nth-child(2)');
  await expect(jobCells.first()).toHaveText('J-2620');
  for (const text of await jobCells.allTextContents()) expect(text).toBe('J-2620');
  await expect(page.getByRole('link', { name: 'Users' })).toHaveCount(0);
  await page.getByRole('link', { name: 'Bays' }).click();
  await expect(page.getByRole('heading', { name: 'Bay matching' })).toBeVisible();
  await expect(page.getByLabel('Erection bay').locator('option').nth(1)).toBeAttached();
  const options = await page.getByLabel('Erection bay').locator('option').allTextContents();
  expect(options.slice(1).length).toBeGreaterThan(0);
  for (const o of options.slice(1)) expect(o).toMatch(/^J-2620 ·/);
});

test('an engineer prints QR tags for the pieces of a job', async ({ page }) => {
  await signInAs(page, 'engineer@ridgeback.example');
  await page.getByRole('link', { name: 'Tags' }).click();
  await page.getByLabel('Job').selectOption({ label: 'J-2620 Cedar Creek Bridge' });
  const tags = page.getByRole('img', { name: /QR code for piece G-/ });
  await expect(tags.first()).toBeVisible();
  await expect(tags.first().locator('svg')).toHaveCount(1);
  await expect(page.getByRole('button', { name: /Print \d+ tags/ })).toBeEnabled();
});
