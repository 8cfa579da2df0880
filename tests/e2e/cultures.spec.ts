import { test, expect } from '@playwright/test';
import { shot, signUpThroughForm } from './support';

/** A small real PNG (48 × 32, one warm colour): a stand-in for a photo of a jar. */
const JAR_PNG = Buffer.from(
  'iVBORw0KGgoAAAANSUhEUgAAADAAAAAgCAIAAADbtmxLAAAACXBIWXMAAAPoAAAD6AG1e1JrAAAASUlEQVRYhe2WAQkAQAwCl8+I5rlgH2PPOFgAET03NF/drCtAQdGhmiFsWdbxg2CMDtUMYcuyDiF80KJDNUPYssihCMY6HRwe1wc1efCIuMBoVgAAAABJRU5ErkJggg==',
  'base64',
);

test('bottle dregs to a quarantined lineage: add, count, photo, re-culture twice, flag descendants', async ({
  page,
}) => {
  test.setTimeout(150_000); // a long journey through many pages
  await signUpThroughForm(page);

  // Add a bottle-dregs culture through the guided form; a bad first attempt changes nothing.
  await page.getByRole('link', { name: /add your first culture/i }).click();
  await expect(page).toHaveURL(/\/cultures\/new$/);
  await expect(page.getByText('Harvesting the sediment')).toBeVisible();
  await expect(page.getByText(/sealed jar or bottle can build pressure/i)).toBeVisible();
  await page.getByRole('button', { name: 'Add to the keep' }).click();
  await expect(page.getByText('Enter the beer the sediment came from')).toBeVisible();
  await expect(page).toHaveURL(/\/cultures\/new$/);

  await page.getByLabel('Beer the sediment came from').fill('Lamplighter Farmhouse Ale');
  await page.getByLabel('Bottles pooled').fill('2');
  await page.getByLabel('No, bottle-conditioned').check();
  await page.getByLabel('Strain name').fill('Lamplighter house');
  await page.getByLabel('Place (optional)').fill('Fridge door');
  await page.getByRole('button', { name: 'Add to the keep' }).click();
  await expect(page.getByRole('heading', { name: 'Lamplighter house', level: 1 })).toBeVisible();
  const rootUrl = page.url();
  await expect(page.getByText('Live cells — estimate')).toBeVisible();

  // Log a hemocytometer count with a stain.
  const log = page.getByRole('form', { name: 'Add to the log' });
  await log.getByLabel('What happened?').selectOption('counted');
  await log.getByLabel('Cells counted').fill('260');
  await log.getByLabel('Squares').fill('5');
  await log.getByLabel('Dilution ×').fill('10');
  await log.getByLabel('Live (clear)').fill('120');
  await log.getByLabel('Dead (stained)').fill('80');
  await log.getByLabel(/Volume of the whole culture/).fill('30');
  await log.getByRole('button', { name: 'Add to the log' }).click();
  await expect(page.getByText('Viability (from your stain, projected)')).toBeVisible();
  await expect(page.getByText(/60% alive/)).toBeVisible();

  // Upload a photo; a text file dressed as a JPEG is refused.
  const upload = page.getByRole('form', { name: 'Upload a photo' });
  await upload
    .getByLabel('Photo', { exact: true })
    .setInputFiles({ name: 'notes.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('just text') });
  await upload.getByRole('button', { name: 'Upload' }).click();
  await expect(upload.getByText(/not a photo we can read/)).toBeVisible();
  await upload
    .getByLabel('Photo', { exact: true })
    .setInputFiles({ name: 'jar.png', mimeType: 'image/png', buffer: JAR_PNG });
  await upload.getByLabel('Caption (optional)').fill('Sediment after swirling');
  await upload.getByRole('button', { name: 'Upload' }).click();
  const thumb = page.getByRole('img', { name: 'Sediment after swirling' });
  await expect(thumb).toBeVisible();
  await expect
    .poll(() => thumb.evaluate((img) => (img as unknown as { naturalWidth: number }).naturalWidth))
    .toBeGreaterThan(0);

  // Re-culture it, then re-culture the child.
  for (const name of ['Lamplighter slant', 'Lamplighter starter']) {
    await page.getByRole('link', { name: 'Re-culture' }).click();
    await expect(page.getByText('Grown from', { exact: true })).toBeVisible();
    await page.getByLabel('Strain name').fill(name);
    await page.getByRole('button', { name: 'Add to the keep' }).click();
    await expect(page.getByRole('heading', { name, level: 1 })).toBeVisible();
    await expect(page.getByText(/generation 0/)).toBeVisible();
  }

  // The lineage shows all three, founding culture first.
  await page.getByRole('link', { name: 'Lineage' }).click();
  await expect(page.getByText('3 cultures from the founding one down', { exact: false })).toBeVisible();
  const items = page.getByRole('treeitem');
  await expect(items).toHaveCount(3);
  await expect(items.nth(0)).toContainText('Lamplighter house');
  await shot(page, 'cultures-lineage');

  // Quarantine the root: the descendants are listed first, then flagged.
  await page.goto(rootUrl);
  await page.getByRole('button', { name: 'Contamination confirmed…' }).click();
  const confirm = page.getByRole('region', { name: 'Confirm contamination' });
  await expect(confirm.getByText('Lamplighter slant')).toBeVisible();
  await expect(confirm.getByText('Lamplighter starter')).toBeVisible();
  await confirm.getByLabel(/What did you see/).fill('Film on the surface, smells of solvent');
  await confirm.getByRole('button', { name: 'Quarantine and flag 2' }).click();
  await expect(page.getByText(/Quarantined · generation 0/)).toBeVisible();

  await page.getByRole('link', { name: 'Lineage' }).click();
  await expect(page.getByRole('treeitem').filter({ hasText: 'suspect' })).toHaveCount(3);
  await page.getByRole('treeitem').filter({ hasText: 'Lamplighter starter' }).getByRole('link').click();
  await expect(page.getByText('Suspected contamination')).toBeVisible();
  await expect(page.getByText(/confirmed in an ancestor, Lamplighter house/)).toBeVisible();
  await shot(page, 'cultures-suspect-descendant');

  // And the library lists all three, the suspect ones marked.
  await page.getByRole('link', { name: 'Cultures', exact: true }).click();
  await expect(page.getByRole('table')).toBeVisible();
  await expect(page.getByRole('row').filter({ hasText: 'suspect' })).toHaveCount(3);
});
