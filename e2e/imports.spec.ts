import { expect, test } from '@playwright/test';
import { signInAs } from './helpers';

test('an engineer imports a CSV with two bad rows, fixes the mapping, commits, downloads the refused rows and sees the readings', async ({ page }) => {
  const tag = `bed-survey-${Date.now()}`;
  // A time of its own, so a second run against the same database adds its own readings.
  const now = Date.now();
  const at = (m: number): string => `2026-10-${String(10 + (now % 17)).padStart(2, '0')} ${String(5 + (Math.floor(now / 17) % 3)).padStart(2, '0')}:${String((now + m) % 60).padStart(2, '0')}`;
  const csv = [
    'Piece,Reading time,Camber,Remark',
    `HC-201,${at(0)},5/8,${tag} a`,
    `HC-202,${at(1)},11/16,${tag} b`,
    `HC-203,${at(2)},3/4,${tag} c`,
    `HC-204,${at(3)},abc,${tag} d`,
    `ZZ-999,${at(4)},1/2,${tag} e`,
  ].join('\n');
  await signInAs(page, 'engineer@ridgeback.example');
  await page.getByRole('link', { name: 'Imports' }).click();
  await page.getByLabel('CSV file (UTF-8)').setInputFiles({ name: 'bed-survey.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
  await page.getByRole('button', { name: 'Upload' }).click();
  await expect(page.getByRole('heading', { name: /bed-survey\.csv: match the columns/ })).toBeVisible();
  // The proposal reads "Reading time" as the camber; the engineer puts it right.
  await expect(page.getByLabel('Camber (required)')).toHaveValue('Reading time');
  await page.getByLabel('Camber (required)').selectOption('Camber');
  await page.getByLabel('Taken at (YYYY-MM-DD HH:mm) (required)').selectOption('Reading time');
  await page.getByRole('button', { name: 'Preview' }).click();
  await expect(page.getByRole('heading', { name: 'Preview: 3 of 5 rows can be imported' })).toBeVisible();
  await expect(page.getByRole('cell', { name: /no piece "ZZ-999"/ })).toBeVisible();
  await page.getByRole('button', { name: 'Import' }).click();
  await expect(page.getByRole('status').filter({ hasText: '3 added · 0 already there · 2 refused' })).toBeVisible();
  const download = page.waitForEvent('download');
  await page.getByRole('link', { name: /Download the refused rows/ }).click();
  const file = await download;
  const { readFileSync } = await import('node:fs');
  const text = readFileSync((await file.path())!, 'utf8');
  expect(text.split('\n')[0]).toBe('Piece,Reading time,Camber,Remark,error');
  expect(text).toContain('ZZ-999');
  expect(text).toContain('HC-204');

  await page.getByRole('link', { name: 'Pieces' }).click();
  await page.getByLabel('Find by mark').fill('HC-202');
  await page.getByRole('table').getByRole('link', { name: 'HC-202', exact: true }).click();
  await expect(page.getByRole('row').filter({ hasText: `${tag} b` })).toContainText('11/16 in');
});
