import { test, expect, type Page } from '@playwright/test';
import { fileURLToPath } from 'node:url';
import { shot, signUpThroughForm } from './support';

// jsQR's browser build, from the API package's dev dependencies
const JSQR = fileURLToPath(new URL('../../apps/api/node_modules/jsqr/dist/jsQR.js', import.meta.url));

/** Decode a QR code from a PNG by drawing it onto a canvas in a blank page and running jsQR there. */
async function decodeQr(page: Page, png: Buffer): Promise<string | null> {
  const scratch = await page.context().newPage();
  await scratch.setContent('<!doctype html><canvas id="c"></canvas>');
  await scratch.addScriptTag({ path: JSQR });
  const result = await scratch.evaluate(async (b64) => {
    const img = new Image();
    img.src = `data:image/png;base64,${b64}`;
    await img.decode();
    const c = document.getElementById('c') as HTMLCanvasElement;
    c.width = img.width;
    c.height = img.height;
    const g = c.getContext('2d')!;
    g.fillStyle = '#fff';
    g.fillRect(0, 0, c.width, c.height);
    g.drawImage(img, 0, 0);
    const d = g.getImageData(0, 0, c.width, c.height);
    const jsQR = (
      window as unknown as { jsQR: (d: Uint8ClampedArray, w: number, h: number) => { data: string } | null }
    ).jsQR;
    return jsQR(d.data, d.width, d.height)?.data ?? null;
  }, png.toString('base64'));
  await scratch.close();
  return result;
}

test('a jar label prints with a QR code that opens the quick log; reminders and the calendar are set on the account page', async ({
  page,
  baseURL,
}) => {
  test.setTimeout(120_000);
  await signUpThroughForm(page);
  const made = await page.request.post('/api/cultures', {
    headers: { Origin: baseURL! },
    data: {
      strainName: 'Millrace Kellerbier slurry',
      form: 'slurry_unwashed',
      origin: { origin: 'batch_slurry', batchName: 'Batch 7: Kellerbier', crop: 'bottom', washed: false },
      amount: { volumeMl: 250 },
      locationLabel: 'Jar B3',
      storageTempC: 3,
      madeAt: new Date(Date.now() - 3_600_000).toISOString(),
    },
  });
  expect(made.status()).toBe(201);
  const { culture } = (await made.json()) as { culture: { id: string; labelCode: string } };
  const id = culture.id;
  // the person's first culture: the strain's first letter and number 1
  expect(culture.labelCode).toBe('M-001');

  // the header shows the notices link with nothing unread
  await expect(page.getByRole('link', { name: 'Notices, none unread' })).toBeVisible();
  await page.getByRole('link', { name: 'Notices, none unread' }).click();
  await expect(page.getByRole('heading', { name: 'No notices yet' })).toBeVisible();
  await shot(page, 'reminders-01-notices-empty');

  // the label sheet
  await page.goto(`/labels?ids=${id}`);
  const label = page.getByTestId('jar-label');
  await expect(label).toBeVisible();
  await expect(label).toContainText('Millrace Kellerbier slurry');
  await expect(label).toContainText('M-001');
  await expect(label).toContainText('3 °C · Jar B3');
  await shot(page, 'reminders-02-label-sheet');
  const decoded = await decodeQr(page, await label.screenshot({ scale: 'device' }));
  expect(decoded).toBe(`${baseURL}/cultures/${id}/quick`);

  // the single small label, and print media hides the page around it
  await page.getByRole('button', { name: 'Single small label' }).click();
  await expect(page).toHaveURL(/layout=single/);
  await page.emulateMedia({ media: 'print' });
  await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
  await expect(page.getByTestId('jar-label')).toBeVisible();
  const small = await page.getByTestId('jar-label').boundingBox();
  // 50 × 25 mm at 96 px per inch ≈ 189 × 94 px
  expect(Math.round(small!.width)).toBeGreaterThanOrEqual(186);
  expect(Math.round(small!.width)).toBeLessThanOrEqual(191);
  expect(await decodeQr(page, await page.getByTestId('jar-label').screenshot({ scale: 'device' }))).toBe(
    `${baseURL}/cultures/${id}/quick`,
  );
  await shot(page, 'reminders-03-label-single-print');
  await page.emulateMedia({ media: 'screen' });

  // the PNG download decodes too
  const png = await page.request.get(`/api/labels/${id}/png?size=small`);
  expect(png.headers()['content-type']).toBe('image/png');
  expect(await decodeQr(page, Buffer.from(await png.body()))).toBe(`${baseURL}/cultures/${id}/quick`);

  // scanning opens the quick log on a phone
  await page.setViewportSize({ width: 360, height: 740 });
  await page.goto(decoded!);
  await expect(page.getByRole('heading', { name: 'Millrace Kellerbier slurry' })).toBeVisible();
  await page.getByRole('button', { name: 'Fed' }).click();
  await page.getByRole('button', { name: 'Log it' }).click();
  await expect(page.getByText(/Enter wort volume|wort volume/i).first()).toBeVisible();
  await page.getByLabel('Wort added (mL)').fill('500');
  await page.getByRole('button', { name: 'Log it' }).click();
  await expect(page.getByText('Feed logged.')).toBeVisible();
  await shot(page, 'reminders-04-quick-log-phone');
  const events = await (await page.request.get(`/api/cultures/${id}/events`)).json();
  expect(
    events.events.some(
      (e: { kind: string; data: { volumeMl?: number } }) => e.kind === 'fed' && e.data.volumeMl === 500,
    ),
  ).toBe(true);
  await page.getByRole('button', { name: 'Moved' }).click();
  await page.getByLabel('Kept at (°C)').fill('20');
  await page.getByLabel('New place').fill('Garage shelf');
  await page.getByRole('button', { name: 'Log it' }).click();
  await expect(page.getByText('Move logged.')).toBeVisible();
  await page.setViewportSize({ width: 1280, height: 900 });

  // reminder settings on the account page: bad input first, then a good save
  await page.goto('/account');
  await page.getByLabel('Viability threshold (%)').fill('0');
  await page.getByRole('button', { name: 'Save reminders' }).click();
  await expect(page.getByText(/must be at least 5/)).toBeVisible();
  await page.getByLabel('Viability threshold (%)').fill('60');
  await page.getByLabel('One digest a day').check();
  await page.getByLabel('Digest hour (0–23, your time)').fill('6');
  await page.getByLabel('Generation limit reached').uncheck();
  await page.getByRole('button', { name: 'Save reminders' }).click();
  await expect(page.getByText('Your reminder settings are updated.')).toBeVisible();
  const prefs = await (await page.request.get('/api/reminder-preferences')).json();
  expect(prefs.preferences).toMatchObject({
    viabilityThresholdPct: 60,
    emailDelivery: 'digest',
    digestHour: 6,
    mutedKinds: ['culture.generation'],
  });

  // a private calendar address, readable without the session, then turned off
  await page.getByRole('button', { name: 'Make a calendar address' }).click();
  const address = await page.getByLabel(/Your calendar address/).inputValue();
  expect(address).toMatch(/\/api\/calendar\/[\w-]+\.ics$/);
  await shot(page, 'reminders-05-account-reminders');
  const anon = await page.context().browser()!.newContext();
  const feed = await anon.request.get(address);
  expect(feed.status()).toBe(200);
  expect(await feed.text()).toContain('Millrace Kellerbier slurry');
  await page.getByRole('button', { name: 'Turn the address off' }).click();
  await expect(page.getByTestId('calendar-status')).toHaveText('No calendar address yet.');
  expect((await anon.request.get(address)).status()).toBe(404);
  await anon.close();
});
