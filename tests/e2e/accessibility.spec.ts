import { test, expect, type Page } from '@playwright/test';
import { AxeBuilder } from '@axe-core/playwright';
import { signUpThroughForm } from './support';

/**
 * axe-core (WCAG 2.x A and AA rules) on the pages the Lighthouse run measures: the sign-in page,
 * the culture library with rows in it, and a culture page. Serious and critical findings fail the
 * test; the whole list is printed so a failure says what to fix.
 */
async function seriousViolations(page: Page) {
  const results = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

test('sign-in, library and culture pages have no serious or critical axe findings', async ({ page, baseURL }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('button', { name: /sign in/i })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);

  await signUpThroughForm(page);
  const madeAt = new Date(Date.now() - 3 * 86_400_000).toISOString();
  for (const [strainName, beerName] of [
    ['Weir Lane saison dregs', 'Weir Lane Saison'],
    ['Copperbeck stout dregs', 'Copperbeck Stout'],
  ]) {
    const res = await page.request.post('/api/cultures', {
      headers: { Origin: baseURL! },
      data: {
        strainName,
        form: 'bottle_dregs',
        origin: { origin: 'bottle_dregs', beerName, bottleCount: 2, pasteurized: 'no' },
        storageTempC: 4,
        madeAt,
      },
    });
    expect(res.status(), await res.text()).toBe(201);
  }

  await page.goto('/cultures');
  await expect(page.getByRole('link', { name: 'Copperbeck stout dregs' })).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);

  await page.getByRole('link', { name: 'Weir Lane saison dregs' }).click();
  await expect(page.getByRole('heading', { name: 'Weir Lane saison dregs', level: 1 })).toBeVisible();
  await expect(page.getByText('Live cells — estimate')).toBeVisible();
  expect(await seriousViolations(page)).toEqual([]);
});
