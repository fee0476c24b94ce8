import { expect, test } from '@playwright/test';
import { DEMO_PASSWORD, signInAs } from './helpers';

test('an engineer matches a bay and accepts the proposal', async ({ page }) => {
  await signInAs(page, 'engineer@ridgeback.example');
  await page.getByRole('link', { name: 'Bays' }).click();
  const pick = page.getByLabel('Erection bay');
  const option = await pick.locator('option').nth(1).getAttribute('value');
  await pick.selectOption(option!);
  await expect(page.getByRole('heading', { name: 'Proposal' })).toBeVisible();
  await expect(page.getByRole('region', { name: 'Proposal' }).getByRole('listitem').first()).toBeVisible();
  await page.getByRole('button', { name: 'Accept the proposal' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Arrangement saved' })).toBeVisible();
});

test('a QC manager marks a ready piece shipped from the shipping list', async ({ page, request }) => {
  await request.post('/api/auth/login', { data: { email: 'qc@ridgeback.example', password: DEMO_PASSWORD } });
  // The first day in the next two months with a piece that is ready to go.
  let date = '';
  let mark = '';
  for (let i = 0; i < 60 && !date; i++) {
    const d = new Date(Date.now() + i * 86_400_000).toISOString().slice(0, 10);
    const list = await (await request.get(`/api/shipping?date=${d}`)).json();
    const ready = list.rows.find((r: { blockers: string[] }) => r.blockers.length === 0);
    if (ready) [date, mark] = [d, ready.mark];
  }
  expect(date).not.toBe('');
  await signInAs(page, 'qc@ridgeback.example');
  await page.getByRole('link', { name: 'Shipping' }).click();
  await page.getByLabel('Planned ship date').fill(date);
  await page.getByRole('checkbox', { name: `Ship ${mark}` }).check();
  await page.getByRole('button', { name: /Mark 1 piece shipped/ }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Marked shipped' })).toBeVisible();
  await expect(page.getByRole('checkbox', { name: `Ship ${mark}` })).toHaveCount(0);
});
