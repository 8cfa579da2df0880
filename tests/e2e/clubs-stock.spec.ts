import { test, expect } from '@playwright/test';
import { shot, signUpThroughForm } from './support';

test('a steward makes frozen vials club stock, corrects the count, and withdraws one into a culture with its lineage', async ({
  page,
  baseURL,
}) => {
  test.setTimeout(90_000);
  await signUpThroughForm(page);
  const headers = { Origin: baseURL! };
  // the keeper's own cultures (the culture library's API): dregs, frozen into glycerol vials
  const dregs = await page.request.post('/api/cultures', {
    headers,
    data: {
      strainName: 'Weirside house ale',
      form: 'bottle_dregs',
      origin: { origin: 'bottle_dregs', beerName: 'Weirside Best', bottleCount: 2, pasteurized: 'no' },
      storageTempC: 4,
      madeAt: new Date(Date.now() - 3 * 86_400_000).toISOString(),
    },
  });
  expect(dregs.status()).toBe(201);
  const vials = await page.request.post('/api/cultures', {
    headers,
    data: {
      strainName: 'Weirside house ale vials',
      form: 'frozen_glycerol',
      origin: { origin: 'reculture', method: 'freeze' },
      parentId: (await dregs.json()).culture.id,
      storageTempC: -70,
      madeAt: new Date(Date.now() - 86_400_000).toISOString(),
    },
  });
  expect(vials.status()).toBe(201);
  const vialsId = (await vials.json()).culture.id as string;

  await page.getByRole('link', { name: 'Clubs' }).first().click();
  await page.getByLabel('Club name').fill('Weirside Yeast Library');
  await page.getByRole('button', { name: 'Start the club' }).click();
  await expect(page.getByRole('heading', { name: 'Weirside Yeast Library', level: 1 })).toBeVisible();
  await page.getByRole('link', { name: 'Stock' }).click();
  await expect(page.getByText('No club stock yet')).toBeVisible();
  // cold handling: the caution is on the page and defers to local rules and labels
  await expect(page.getByText(/dry ice/i).first()).toBeVisible();

  // nothing chosen: refused beside the field, nothing added
  await page.getByRole('button', { name: 'Add to the club’s stock' }).click();
  await expect(page.getByText('Choose a culture you keep').last()).toBeVisible();
  await page.getByLabel('Which of your cultures').selectOption(vialsId);
  await page.getByLabel('Kept as').selectOption('vial');
  await page.getByLabel('How many').fill('6');
  await page.getByRole('button', { name: 'Add to the club’s stock' }).click();
  await expect(page.getByText('Weirside house ale vials is club stock now, and listed in the bank.')).toBeVisible();
  const item = page.getByRole('listitem', { name: 'Weirside house ale vials, club stock' });
  await expect(item).toContainText('6 vials left');

  // a stock-take below zero is refused; a real count replaces the figure
  await item.getByRole('button', { name: 'Stock-take…' }).click();
  await item.getByLabel('Counted in the freezer or fridge').fill('-1');
  await item.getByRole('button', { name: 'Correct the count' }).click();
  await expect(item.getByText('Not below zero')).toBeVisible();
  await expect(item).toContainText('6 vials left');
  await item.getByLabel('Counted in the freezer or fridge').fill('5');
  await item.getByRole('button', { name: 'Correct the count' }).click();
  await expect(item).toContainText('5 vials left');

  // withdraw one for oneself: an impossible temperature first, then a real one
  await item.getByRole('button', { name: 'Withdraw one…' }).click();
  await item.getByLabel('Where they will keep it').fill('Kitchen fridge, door shelf');
  await item.getByLabel('Their storage temperature (°C)').fill('90');
  await item.getByRole('button', { name: 'Withdraw one vial' }).click();
  await expect(item.getByText('Above 40 °C is not storage')).toBeVisible();
  await expect(item).toContainText('5 vials left');
  await item.getByLabel('Their storage temperature (°C)').fill('4');
  await item.getByRole('button', { name: 'Withdraw one vial' }).click();
  await expect(item.getByText('One taken out')).toBeVisible();
  await expect(item).toContainText('4 vials left');
  await shot(page, 'clubs-stock-01-withdrawn');

  await item.getByRole('link', { name: 'Open your new culture' }).click();
  await expect(page).toHaveURL(/\/cultures\/[^/]+$/);
  await expect(page.getByText('Kitchen fridge, door shelf').first()).toBeVisible();
  await page
    .getByRole('link', { name: /lineage/i })
    .first()
    .click();
  await expect(page.getByText('Weirside house ale vials').first()).toBeVisible();
  await expect(page.getByText(/club stock/).first()).toBeVisible();
  await expect(page.getByText('Weirside house ale').first()).toBeVisible();
  await shot(page, 'clubs-stock-02-lineage');
});
