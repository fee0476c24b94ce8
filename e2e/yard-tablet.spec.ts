import AxeBuilder from '@axe-core/playwright';
import { expect, test, type Page } from '@playwright/test';
import { serverReadings, signInAs } from './helpers';

test.use({ viewport: { width: 768, height: 1024 }, hasTouch: true });

// Notes carry the run's time, so a re-run against the same database counts only its own rows.
const run = Date.now();

/** Opens the first piece due a reading today from the yard start page; returns its id and mark. */
async function openDuePiece(page: Page): Promise<{ id: string; mark: string }> {
  await expect(page.getByRole('heading', { name: 'Yard readings' })).toBeVisible();
  await page.getByRole('region', { name: /Due a reading today/ }).getByRole('link').first().click();
  await expect(page).toHaveURL(/\/yard\/pieces\//);
  const id = page.url().split('/').pop()!;
  const entryTitle = page.getByRole('heading', { level: 2, name: /^Log a reading for / });
  await expect(entryTitle).toBeVisible();
  const mark = (await entryTitle.textContent())!.replace('Log a reading for ', '');
  return { id, mark };
}

async function logReading(page: Page, value: string, note: string): Promise<void> {
  await page.getByRole('textbox', { name: /^Camber/ }).fill(value);
  await page.getByLabel('Note').fill(note);
  await page.getByRole('button', { name: 'Save the reading' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'is saved on this tablet' })).toBeVisible();
}

async function controlledByServiceWorker(page: Page): Promise<void> {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  await page.reload();
  await expect.poll(() => page.evaluate(() => !!navigator.serviceWorker.controller)).toBe(true);
}

test('find a piece by mark, log a reading, and see at once that it is inside the expected band', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await expect(page).toHaveURL(/\/yard$/);
  await page.getByLabel('Piece mark').fill('g 40');
  await page.getByRole('region', { name: 'Matching pieces' }).getByRole('link').first().click();
  // Read the prediction shown for a first value, then enter exactly the expected camber.
  await page.getByRole('textbox', { name: /^Camber/ }).fill('0');
  const expected = await page.getByText(/^Expected at \d+ days:/).textContent();
  const value = /: (-?[\d /]+) in/.exec(expected!)![1]!;
  await page.getByRole('textbox', { name: /^Camber/ }).fill(value);
  await expect(page.getByRole('status').filter({ hasText: 'Inside the expected band' })).toBeVisible();
  await page.getByRole('textbox', { name: /^Camber/ }).fill(String(Number(value.split(' ')[0]) + 4));
  await expect(page.getByText('Outside the tolerance limits')).toBeVisible();
  await expect(page.getByText('Please measure again before saving')).toBeVisible();
});

test('offline: three readings wait on the tablet across a reload, then reach the server exactly once', async ({ page, context, request }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await controlledByServiceWorker(page);
  const piece = await openDuePiece(page);
  await context.setOffline(true);
  for (const n of [1, 2, 3]) await logReading(page, `1 ${n}/8`, `offline-e2e ${run} ${n}`);
  await expect(page.getByTestId('queue-status')).toContainText('3 readings wait');
  await page.reload();
  await expect(page.getByRole('heading', { name: piece.mark, level: 1 })).toBeVisible();
  await expect(page.getByTestId('queue-status')).toContainText('3 readings wait');
  await context.setOffline(false);
  await page.evaluate(() => window.dispatchEvent(new Event('online')));
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent', { timeout: 15_000 });
  const rows = (await serverReadings(request, piece.id)).filter((r) => r.note?.startsWith(`offline-e2e ${run}`));
  expect(rows.map((r) => r.note).sort()).toEqual([1, 2, 3].map((n) => `offline-e2e ${run} ${n}`));
});

test('a response lost on the way back is retried with the same key and stores one row', async ({ page, request }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  const piece = await openDuePiece(page);
  let dropped = false;
  await page.route('**/api/readings', async (route) => {
    if (dropped) return route.continue();
    dropped = true;
    await route.fetch(); // the server stores the reading…
    await route.abort('connectionreset'); // …and the answer never reaches the tablet
  });
  await logReading(page, '1 1/4', `lost-answer-e2e ${run}`);
  await expect(page.getByTestId('queue-status')).toContainText('1 reading waits');
  await page.getByRole('button', { name: 'Send now' }).click();
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent');
  const rows = (await serverReadings(request, piece.id)).filter((r) => r.note === `lost-answer-e2e ${run}`);
  expect(rows).toHaveLength(1);
});

test('a reading the server refuses lands in "needs attention", with the reason', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await openDuePiece(page);
  await page.route('**/api/readings', (route) =>
    route.fulfill({ status: 422, json: { code: 'idempotency_key_reused', message: 'this Idempotency-Key was already used for a different reading' } }),
  );
  await logReading(page, '1 3/8', 'refused-e2e');
  await expect(page.getByRole('heading', { name: /Needs attention \(1\)/ })).toBeVisible();
  await expect(page.getByText('already used for a different reading')).toBeVisible();
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent');
});

test('keyboard only: reach the value, type it and save with Enter', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  await openDuePiece(page);
  for (let i = 0; i < 30; i++) {
    if ((await page.evaluate(() => document.activeElement?.id)) === 'camber-value') break;
    await page.keyboard.press('Tab');
  }
  expect(await page.evaluate(() => document.activeElement?.id)).toBe('camber-value');
  await page.keyboard.type('1 5/16');
  await page.keyboard.press('Enter');
  await expect(page.getByRole('status').filter({ hasText: '1 5/16 in = 33.3 mm' })).toBeVisible();
});

test('the yard screens have no serious or critical accessibility violations (axe, WCAG 2 A/AA)', async ({ page }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  const yard = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa']).analyze();
  await openDuePiece(page);
  await page.getByRole('textbox', { name: /^Camber/ }).fill('1 3/8');
  const entry = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa']).analyze();
  const serious = [...yard.violations, ...entry.violations].filter((v) => v.impact === 'serious' || v.impact === 'critical');
  expect(serious.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
  // Readable in sun: the enhanced contrast rule (7:1, WCAG 1.4.6) on the entry screen with a verdict shown.
  await page.getByRole('textbox', { name: /^Camber/ }).fill('9');
  const sun = await new AxeBuilder({ page }).withRules(['color-contrast-enhanced']).analyze();
  expect(sun.violations.flatMap((v) => v.nodes.map((n) => `${n.target.join(' ')}: ${n.failureSummary}`))).toEqual([]);
});

test('a sign-in that expired while offline asks to sign in again and keeps the queue', async ({ page, context, request }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  const piece = await openDuePiece(page);
  await context.setOffline(true);
  await logReading(page, '1 7/16', `expired-e2e ${run}`);
  await context.clearCookies();
  await context.setOffline(false);
  await page.evaluate(() => window.dispatchEvent(new Event('online')));
  await expect(page.getByRole('alert').filter({ hasText: 'Your sign-in has expired' })).toBeVisible();
  await expect(page.getByTestId('queue-status')).toContainText('1 reading waits');
  await page.getByRole('link', { name: 'Sign in again' }).click();
  await page.getByLabel('E-mail').fill('inspector@ridgeback.example');
  await page.getByLabel('Password').fill('camber-demo-2026');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent');
  expect((await serverReadings(request, piece.id)).filter((r) => r.note === `expired-e2e ${run}`)).toHaveLength(1);
});

test('the tag scanner asks nothing of any other host (its .wasm is served by the app)', async ({ page }) => {
  const foreign: string[] = [];
  page.on('request', (r) => {
    if (!r.url().startsWith('http://127.0.0.1:') && !r.url().startsWith('data:') && !r.url().startsWith('blob:')) foreign.push(r.url());
  });
  await signInAs(page, 'inspector@ridgeback.example');
  await page.getByRole('button', { name: /Scan a piece tag/ }).click();
  // Headless chromium has no camera: the scanner says so and offers typed entry.
  await expect(page.getByRole('alert').filter({ hasText: 'camera is not available' })).toBeVisible();
  const wasm = await page.evaluate(async () => (await caches.keys()).length > 0 && (await Promise.all((await caches.keys()).map(async (k) => (await (await caches.open(k)).keys()).map((r) => r.url)))).flat().some((u) => u.endsWith('.wasm')));
  expect(wasm).toBe(true);
  expect(foreign).toEqual([]);
});

test('a photo taken with the reading reaches the server with it', async ({ page, request }) => {
  await signInAs(page, 'inspector@ridgeback.example');
  const piece = await openDuePiece(page);
  const png = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAQAAAC1HAwCAAAAC0lEQVR42mNkYAAAAAYAAjCB0C8AAAAASUVORK5CYII=', 'base64');
  await page.getByLabel('Photo (optional)').setInputFiles({ name: 'tape.png', mimeType: 'image/png', buffer: png });
  await expect(page.getByText('tape.png will be sent with the reading')).toBeVisible();
  await logReading(page, '1 1/2', `photo-e2e ${run}`);
  await expect(page.getByTestId('queue-status')).toHaveText('All readings sent');
  const row = (await serverReadings(request, piece.id)).find((r) => r.note === `photo-e2e ${run}`);
  expect(row?.hasPhoto).toBe(true);
});
