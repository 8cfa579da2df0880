import { test, expect, type Page } from '@playwright/test';
import { shot, signUpThroughForm } from './support';

const daysAgo = (n: number) => new Date(Date.now() - n * 86_400_000).toISOString();

/** A culture made through the library's own API, as the other specs do. */
async function makeCulture(page: Page, baseURL: string, data: Record<string, unknown>) {
  const res = await page.request.post('/api/cultures', { headers: { Origin: baseURL }, data });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()).culture as { id: string; generation: number };
}
const slurry = (strainName: string, batchName: string, extra: Record<string, unknown> = {}) => ({
  strainName,
  form: 'slurry_unwashed',
  origin: { origin: 'batch_slurry', batchName, crop: 'bottom', washed: false },
  amount: { volumeMl: 150 },
  storageTempC: 3,
  madeAt: daysAgo(10),
  ...extra,
});

test('edit a culture’s name and parent; a bad name and a loop are refused and change nothing', async ({
  page,
  baseURL,
}) => {
  test.setTimeout(120_000);
  await signUpThroughForm(page);
  const ridge = await makeCulture(page, baseURL!, slurry('Ridge jar', 'Batch 7: Ridge Brown'));
  const meadow = await makeCulture(page, baseURL!, slurry('Meadow jar', 'Batch 2: Meadow Mild', { generation: 2 }));
  const child = await makeCulture(
    page,
    baseURL!,
    slurry('Ridge crop', 'Batch 9: Ridge Porter', { parentId: ridge.id }),
  );
  expect(child.generation).toBe(1);

  await page.goto(`/cultures/${child.id}`);
  await expect(page.getByRole('heading', { name: 'Ridge crop', level: 1 })).toBeVisible();
  await page.getByRole('button', { name: 'Edit details' }).click();
  const form = page.getByRole('form', { name: 'Edit details' });

  // Bad input: the required name cleared. A clear message, nothing sent, nothing changed.
  await form.getByLabel('Strain name').fill('');
  await form.getByRole('button', { name: 'Save details' }).click();
  await expect(form.getByText('Enter a strain name')).toBeVisible();
  await expect(form.getByLabel('Strain name')).toHaveAttribute('aria-invalid', 'true');
  await shot(page, 'culture-edit-empty-name');
  await form.getByRole('button', { name: 'Cancel' }).click();
  await page.reload();
  await expect(page.getByRole('heading', { name: 'Ridge crop', level: 1 })).toBeVisible();

  // Rename it and move it under the other jar (a harvest from a batch adds one to the generation).
  await page.getByRole('button', { name: 'Edit details' }).click();
  await form.getByLabel('Strain name').fill('Ridge crop, porter batch');
  await form.getByLabel('Tags (optional)').fill('porter, house');
  await form.getByLabel('Find a culture').fill('Meadow');
  await expect(form.getByRole('option', { name: /^Meadow jar · gen 2/ })).toHaveCount(1);
  await form.getByLabel('Grown from').selectOption(meadow.id);
  await shot(page, 'culture-edit-form');
  await form.getByRole('button', { name: 'Save details' }).click();
  await expect(page.getByRole('heading', { name: 'Ridge crop, porter batch', level: 1 })).toBeVisible();
  await expect(page.getByText(/generation 3$/)).toBeVisible();
  await expect(page.getByRole('link', { name: 'Meadow jar', exact: true })).toHaveAttribute(
    'href',
    `/cultures/${meadow.id}`,
  );
  // the handling log keeps what it was called before
  await expect(page.getByText('Details corrected: strain name, tags')).toBeVisible();
  await expect(page.getByText('Name: Ridge crop → Ridge crop, porter batch; Tags: — → porter, house')).toBeVisible();
  await expect(page.getByText('Parent corrected')).toBeVisible();
  await shot(page, 'culture-edit-saved');

  // The library and the lineage show the change.
  await page.goto('/cultures');
  await expect(page.getByRole('link', { name: 'Ridge crop, porter batch' })).toBeVisible();
  await page.goto(`/cultures/${meadow.id}/lineage`);
  await expect(page.getByRole('treeitem')).toHaveCount(2);
  await expect(page.getByRole('treeitem').nth(1)).toContainText('Ridge crop, porter');

  // A culture grown from this one is never offered as its parent.
  await page.goto(`/cultures/${meadow.id}`);
  await page.getByRole('button', { name: 'Edit details' }).click();
  await form.getByLabel('Find a culture').fill('Ridge');
  await expect(form.getByRole('option', { name: /^Ridge jar/ })).toHaveCount(1);
  await expect(form.getByRole('option', { name: /^Ridge crop/ })).toHaveCount(0);

  // Bad input the form cannot see: while it is open, Ridge jar is put under this culture elsewhere.
  // Choosing Ridge jar now would close a loop; the API refuses it beside the field and nothing changes.
  const elsewhere = await page.request.patch(`/api/cultures/${ridge.id}`, {
    headers: { Origin: baseURL! },
    data: { parentId: meadow.id },
  });
  expect(elsewhere.status()).toBe(200);
  await form.getByLabel('Grown from').selectOption(ridge.id);
  await form.getByRole('button', { name: 'Save details' }).click();
  await expect(
    form.getByText('That culture descends from this one; a culture cannot be its own ancestor'),
  ).toBeVisible();
  await shot(page, 'culture-edit-loop-refused');
  await page.reload();
  await expect(page.getByText(/generation 2$/)).toBeVisible();
  await expect(page.getByText('Grown from', { exact: true })).toHaveCount(0); // still no parent
  await expect(page.getByText('Parent corrected')).toHaveCount(0);
});

test('a backup with photos round-trips them into a fresh account', async ({ page, baseURL, browser }) => {
  test.setTimeout(120_000);
  await signUpThroughForm(page);
  const jar = await makeCulture(page, baseURL!, slurry('Fern jar', 'Batch 4: Fern Bitter'));
  const png = Buffer.from(
    'iVBORw0KGgoAAAANSUhEUgAAADAAAAAgCAIAAADbtmxLAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAASUlEQVRYhe2WAQkAQAwCl8+I5rlgH2PPOFgAET03NF/drCtAQdGhmiFsWdbxg2CMDtUMYcuyDiF80KJDNUPYssihCMY6HRwe1wc1efCIuMBoVgAAAABJRU5ErkJggg==',
    'base64',
  );
  await page.goto(`/cultures/${jar.id}`);
  const upload = page.getByRole('form', { name: 'Upload a photo' });
  await upload
    .getByLabel('Photo', { exact: true })
    .setInputFiles({ name: 'jar.png', mimeType: 'image/png', buffer: png });
  await upload.getByLabel('Caption (optional)').fill('Fern jar, settled');
  await upload.getByRole('button', { name: 'Upload' }).click();
  await expect(page.getByRole('img', { name: 'Fern jar, settled' })).toBeVisible();

  await page.goto('/cultures');
  await page.getByText('Export, back up or import').click();
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('link', { name: 'Backup with photos (JSON)' }).click(),
  ]);
  const file = await download.path();

  const fresh = await browser.newContext();
  const other = await fresh.newPage();
  await signUpThroughForm(other);
  await other.goto('/cultures');
  await other.getByText('Export, back up or import').click();
  await other.getByLabel('Import a backup file').setInputFiles(file);
  await other.getByRole('button', { name: 'Import', exact: true }).click();
  await expect(other.getByText('Imported 1 culture, 1 log entry and 1 photo.')).toBeVisible();
  await other.getByRole('link', { name: 'Fern jar' }).click();
  await expect(other.getByRole('img', { name: 'Fern jar, settled' })).toBeVisible();
  await shot(other, 'culture-backup-photo-imported');
  await fresh.close();
});
