import { test, expect } from '@playwright/test';
import { shot, signUpThroughForm } from './support';

/**
 * Stored text is shown as text. A culture whose name, place and notes are HTML and script
 * payloads renders them literally on the library and the culture page, and none of them runs.
 */
const PAYLOADS = {
  strainName: '<script>window.__xss = "name"</script>Hollow Oak',
  locationLabel: '<img src=x onerror="window.__xss=\'place\'">',
  notes: '"><svg onload="window.__xss=\'notes\'"></svg><b>bold?</b>',
};

test('an injected <script> in a culture name renders escaped and does not run', async ({ page, baseURL }) => {
  const dialogs: string[] = [];
  page.on('dialog', async (d) => {
    dialogs.push(d.message());
    await d.dismiss();
  });
  await signUpThroughForm(page);

  // Stored through the API with the browser's own session, as a hostile client would.
  const res = await page.request.post('/api/cultures', {
    headers: { Origin: baseURL! },
    data: {
      ...PAYLOADS,
      form: 'slurry_unwashed',
      origin: {
        origin: 'batch_slurry',
        batchName: '<script>window.__xss="batch"</script>',
        crop: 'bottom',
        washed: false,
      },
      storageTempC: 4,
      madeAt: new Date(Date.now() - 3_600_000).toISOString(),
    },
  });
  expect(res.status()).toBe(201);
  const { culture } = (await res.json()) as { culture: { id: string } };

  await page.goto('/cultures');
  await expect(page.getByText(PAYLOADS.strainName).first()).toBeVisible();
  await shot(page, 'escaping-library');

  await page.goto(`/cultures/${culture.id}`);
  await expect(page.getByRole('heading', { name: PAYLOADS.strainName, level: 1 })).toBeVisible();
  await expect(page.getByText(PAYLOADS.locationLabel).first()).toBeVisible();
  await shot(page, 'escaping-culture');

  expect(await page.evaluate(() => (window as unknown as { __xss?: string }).__xss)).toBeUndefined();
  expect(dialogs).toEqual([]);
  // nothing from the payloads became an element
  expect(await page.locator('main script, main img[src="x"], main svg[onload]').count()).toBe(0);
});
