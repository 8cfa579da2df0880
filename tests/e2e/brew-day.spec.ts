import { test, expect } from '@playwright/test';
import { shot, signUpThroughForm } from './support';

test('plan a lager from bottle dregs, log a counted step, pitch, harvest, and see the generations', async ({
  page,
  baseURL,
}) => {
  test.setTimeout(120_000);
  await signUpThroughForm(page);

  // a jar of sediment from two bottles of an invented beer (the culture library's own API)
  const made = await page.request.post('/api/cultures', {
    headers: { Origin: baseURL! },
    data: {
      strainName: 'Millrace Kellerbier dregs',
      form: 'bottle_dregs',
      origin: { origin: 'bottle_dregs', beerName: 'Millrace Kellerbier', bottleCount: 2, pasteurized: 'no' },
      storageTempC: 4,
      madeAt: new Date(Date.now() - 3_600_000).toISOString(),
    },
  });
  expect(made.status()).toBe(201);
  const cultureId = (await made.json()).culture.id as string;

  await page.getByRole('link', { name: 'Brew day' }).first().click();
  await page.getByRole('link', { name: 'Plan a starter' }).first().click();
  await expect(page.getByRole('heading', { name: 'Plan a starter', level: 1 })).toBeVisible();
  await page.getByLabel(/Millrace Kellerbier dregs/).check();
  await page.getByLabel('Batch volume (litres)').fill('20');
  await page.getByLabel('Original gravity (SG)').fill('1.048');
  await page.getByLabel('Kind of beer (sets the pitch rate)').selectOption('lager');

  // the ladder appears and recomputes as the person types
  const ladder = page.getByTestId('ladder-step');
  await expect(ladder.first()).toBeVisible();
  expect(await ladder.count()).toBeGreaterThanOrEqual(2);
  await expect(ladder.first()).toContainText('1.022');
  await expect(ladder.first()).toContainText('liquid extract');
  await expect(page.getByTestId('verdict')).toBeVisible();
  await expect(page.getByText(/never a sealed lid/)).toBeVisible();
  const at20 = await page.getByTestId('ladder').innerText();
  await page.getByLabel('Batch volume (litres)').fill('40');
  await expect.poll(async () => page.getByTestId('ladder').innerText()).not.toBe(at20);
  await page.getByLabel('Batch volume (litres)').fill('20');
  await shot(page, 'brew-01-planner');

  await page.getByLabel('Name of the plan').fill('Millrace Helles, spring');
  await page.getByRole('button', { name: 'Save plan' }).click();
  await expect(page.getByRole('heading', { name: 'Millrace Helles, spring', level: 1 })).toBeVisible();
  await expect(page.getByText('Starter under way')).toHaveCount(0);
  const savedLadder = page.getByTestId('ladder-step');
  const beforeFirst = await savedLadder.first().innerText();
  await shot(page, 'brew-02-saved-plan');

  // start the first step, then complete it with a low count: the rest is re-planned
  await page.getByRole('button', { name: 'Start step 1' }).click();
  await expect(page.getByTestId('logged-step')).toContainText('under way');
  const pending = await page.getByTestId('ladder').innerText();
  await page.getByLabel('Cells counted').fill('30');
  await page.getByLabel('Medium squares counted').fill('5');
  await page.getByLabel('Dilution factor (stain included)').fill('2');
  await page.getByRole('button', { name: 'Complete step 1' }).click();
  await expect(page.getByTestId('logged-step')).toContainText('of predicted');
  await expect.poll(async () => page.getByTestId('ladder').innerText()).not.toBe(pending);
  expect(await page.getByTestId('ladder-step').first().innerText()).not.toBe(beforeFirst);
  await shot(page, 'brew-03-after-count');

  // pitch into a batch
  await page.getByRole('link', { name: 'Pitch into a batch' }).click();
  await expect(page.getByLabel('Batch name')).toHaveValue('Millrace Helles, spring');
  await page.getByLabel('Final gravity (SG)').fill('1.010');
  await page.getByLabel('Lag time: hours to visible activity').fill('16');
  await page.getByRole('button', { name: 'Record batch and pitch' }).click();
  await expect(page.getByRole('heading', { name: 'Millrace Helles, spring', level: 1 })).toBeVisible();
  await expect(page.getByTestId('batch-derived')).toContainText('% ABV');
  await shot(page, 'brew-04-batch');

  // harvest slurry: a new culture one generation on, in the lineage
  await page.getByLabel('Slurry volume (mL)').fill('150');
  await page.getByRole('button', { name: 'Save harvested slurry' }).click();
  await expect(page.getByText('saved as generation 1')).toBeVisible();
  await page.getByRole('link', { name: 'Open the new culture' }).click();
  await expect(page).toHaveURL(/\/cultures\/[^/]+$/);
  const childUrl = page.url();
  await page.goto(`/cultures/${cultureId}/lineage`);
  await expect(page.getByText(/gen 1/).first()).toBeVisible();
  await shot(page, 'brew-05-lineage');

  // the batch in the generation chart
  await page.goto(`/batches/generations?cultureId=${childUrl.split('/').pop()}`);
  await expect(page.getByTestId('generation-chart')).toBeVisible();
  await expect(page.getByRole('cell', { name: 'Millrace Helles, spring' })).toBeVisible();
  await shot(page, 'brew-06-generations');
});

test('call a plan off (after a second, explicit step) and take it up again', async ({ page, baseURL }) => {
  await signUpThroughForm(page);
  const made = await page.request.post('/api/cultures', {
    headers: { Origin: baseURL! },
    data: {
      strainName: 'Lantern Row ale yeast',
      form: 'slurry_washed',
      origin: { origin: 'gift', fromName: 'A club friend' },
      amount: { volumeMl: 150 },
      storageTempC: 3,
      madeAt: new Date(Date.now() - 5 * 86_400_000).toISOString(),
    },
  });
  expect(made.status()).toBe(201);
  const planned = await page.request.post('/api/plans', {
    headers: { Origin: baseURL! },
    data: {
      name: 'Lantern Row bitter',
      purpose: 'batch',
      cultureIds: [(await made.json()).culture.id],
      batchVolumeL: 20,
      ogPlato: 11,
      beerType: 'ale',
      brewAt: new Date(Date.now() + 7 * 86_400_000).toISOString(),
    },
  });
  expect(planned.status()).toBe(201);
  const planId = (await planned.json()).plan.id as string;

  await page.goto(`/plans/${planId}`);
  await expect(page.getByRole('heading', { name: 'Lantern Row bitter', level: 1 })).toBeVisible();
  await page.getByRole('button', { name: 'Call this plan off' }).click();
  // the first click only asks; keeping the plan changes nothing
  await page.getByRole('button', { name: 'Keep the plan' }).click();
  expect((await (await page.request.get(`/api/plans/${planId}`)).json()).plan.status).toBe('planned');

  await page.getByRole('button', { name: 'Call this plan off' }).click();
  await page.getByRole('button', { name: 'Yes, call it off' }).click();
  await expect(page.getByText('This plan is called off: no reminders come for it.')).toBeVisible();
  await expect(page.getByText(/^Called off/)).toBeVisible();
  await expect(page.getByRole('link', { name: 'Pitch into a batch' })).toHaveCount(0);
  await shot(page, 'brew-02-called-off');

  await page.getByRole('button', { name: 'Take the plan up again' }).click();
  await expect(page.getByRole('button', { name: 'Call this plan off' })).toBeVisible();
  expect((await (await page.request.get(`/api/plans/${planId}`)).json()).plan.status).toBe('planned');
});

test('pitch straight from a culture’s page, without a plan; nothing ticked is refused', async ({ page, baseURL }) => {
  await signUpThroughForm(page);
  const headers = { Origin: baseURL! };
  const make = async (strainName: string) => {
    const res = await page.request.post('/api/cultures', {
      headers,
      data: {
        strainName,
        form: 'slurry_washed',
        origin: { origin: 'gift', fromName: 'A club friend' },
        amount: { volumeMl: 200 },
        storageTempC: 3,
        madeAt: new Date(Date.now() - 4 * 86_400_000).toISOString(),
      },
    });
    expect(res.status()).toBe(201);
    return (await res.json()).culture.id as string;
  };
  const main = await make('Sedgefield lager slurry');
  const other = await make('Sedgefield ale slurry');

  await page.goto(`/cultures/${main}`);
  await page.getByRole('link', { name: 'Pitch into a batch' }).click();
  await expect(page.getByRole('heading', { name: 'Pitch into a batch', level: 1 })).toBeVisible();
  const picker = page.getByRole('group', { name: 'Which cultures went in' });
  await expect(picker.getByLabel(/Sedgefield lager slurry/)).toBeChecked();
  await expect(picker.getByLabel(/Sedgefield ale slurry/)).not.toBeChecked();

  await page.getByLabel('Batch name').fill('Sedgefield dark lager');
  await page.getByLabel('Volume (litres)').fill('19');
  await page.getByLabel('Original gravity (SG)').fill('1.052');
  await picker.getByLabel(/Sedgefield lager slurry/).uncheck();
  await page.getByRole('button', { name: 'Record batch and pitch' }).click();
  await expect(page.getByText('Choose the culture you pitched')).toBeVisible();
  expect((await (await page.request.get('/api/batches')).json()).batches).toHaveLength(0);

  await picker.getByLabel(/Sedgefield lager slurry/).check();
  await picker.getByLabel(/Sedgefield ale slurry/).check();
  await page.getByRole('button', { name: 'Record batch and pitch' }).click();
  await expect(page.getByRole('heading', { name: 'Sedgefield dark lager', level: 1 })).toBeVisible();
  await shot(page, 'brew-03-pitched-without-plan');
  for (const id of [main, other]) {
    const events = (await (await page.request.get(`/api/cultures/${id}/events`)).json()).events as { kind: string }[];
    expect(events.some((e) => e.kind === 'pitched')).toBe(true);
  }
  // a used-up culture no longer offers to be pitched
  await page.goto(`/cultures/${main}`);
  await expect(page.getByRole('heading', { name: 'Sedgefield lager slurry', level: 1 })).toBeVisible();
  await expect(page.getByRole('link', { name: 'Pitch into a batch' })).toHaveCount(0);
  // and its batches by generation are one click away
  await page.getByRole('link', { name: 'Batches by generation' }).click();
  await expect(page.getByRole('cell', { name: 'Sedgefield dark lager' })).toBeVisible();
});
