import { test, expect } from '@playwright/test';
import { newKeeper, shot, signUpThroughForm } from './support';

test('invite, sign up from the link, ask for a strain, accept, confirm receipt, lineage across owners, quarantine upstream notifies the recipient', async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  const owner = newKeeper();
  const invitee = newKeeper();
  const clubName = `Weir Street Yeast Swap ${invitee.email.slice(7, 13)}`;
  const strain = `Millpond farmhouse ${invitee.email.slice(9, 13)}`;

  // The owner keeps a culture of bottle dregs.
  await signUpThroughForm(page, owner);
  await page.goto('/cultures/new');
  await page.getByLabel('Beer the sediment came from').fill('Lantern Row Saison');
  await page.getByLabel('Bottles pooled').fill('2');
  await page.getByLabel('No, bottle-conditioned').check();
  await page.getByLabel('Strain name').fill(strain);
  await page.getByLabel('Place (optional)').fill('Owner-only shelf note');
  await page.getByRole('button', { name: 'Add to the keep' }).click();
  await expect(page.getByRole('heading', { name: strain, level: 1 })).toBeVisible();
  const rootUrl = page.url();

  // Starts a club and invites by e-mail.
  await page.goto('/clubs');
  await page.getByLabel('Club name').fill(clubName);
  await page.getByRole('button', { name: 'Start the club' }).click();
  await expect(page.getByRole('heading', { name: clubName, level: 1 })).toBeVisible();
  const clubUrl = page.url();
  await page.getByRole('link', { name: 'Invitations' }).click();
  await page.getByLabel('Their e-mail').fill(invitee.email);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${invitee.email}`)).toBeVisible();

  // Lists the culture in the club's bank from the culture page.
  await page.goto(rootUrl);
  await page.getByLabel('A note for the members').fill('Ask me at the Sunday swap');
  await page.getByRole('button', { name: 'List in the bank' }).click();
  await expect(page.getByText(`Listed in ${clubName}`)).toBeVisible();
  await shot(page, 'clubs-handoff-01-offered-from-culture');

  // The invitee signs up from the link in the fake inbox.
  const other = await browser.newContext();
  const guest = await other.newPage();
  await guest.goto('/dev/mail');
  await guest
    .getByRole('link', { name: new RegExp(`invited you to ${clubName}`) })
    .first()
    .click();
  await guest
    .getByRole('link', { name: /\/invitation\?token=/ })
    .first()
    .click();
  await expect(guest.getByRole('heading', { name: `Join ${clubName}` })).toBeVisible();
  await guest.getByLabel('Your name').fill(invitee.name);
  await guest.getByLabel('Password', { exact: true }).fill(invitee.password);
  await guest.getByRole('button', { name: 'Create account and join' }).click();
  await expect(guest.getByRole('heading', { name: clubName, level: 1 })).toBeVisible();

  // The bank: a table with keeper, form, generation, viability and whether it can be requested.
  await guest.getByRole('link', { name: 'Bank' }).click();
  const row = guest.getByRole('row').filter({ hasText: strain });
  await expect(row).toContainText(owner.name);
  await expect(row).toContainText('Bottle sediment');
  await expect(row).toContainText('%');
  await expect(row).toContainText('Yes');
  await expect(guest.getByText('Owner-only shelf note')).toHaveCount(0);
  await shot(guest, 'clubs-handoff-02-bank');
  await row.getByRole('button', { name: `Ask for ${strain}` }).click();
  const soon = new Date(Date.now() + 10 * 86_400_000).toISOString().slice(0, 10);
  await guest.getByLabel('Message').fill('For a saison on the first of the month');
  await guest.getByLabel('Needed by').fill(soon);
  await guest.getByLabel('In what form').selectOption('slant');
  await shot(guest, 'clubs-handoff-03-request-form');
  await guest.getByRole('button', { name: 'Send the request' }).click();
  await expect(guest.getByText(`Request for ${strain} sent`)).toBeVisible();
  // the bank no longer offers to ask twice
  await expect(row).toContainText('You asked');
  await expect(row.getByRole('button', { name: `Ask for ${strain}` })).toHaveCount(0);
  await expect(row.getByRole('link', { name: 'See your request' })).toBeVisible();
  // on the requests page the one who asked may take it back; asked once more, keeping it changes nothing
  await row.getByRole('link', { name: 'See your request' }).click();
  const own = guest.getByRole('listitem', { name: `Request for ${strain} by ${invitee.name}` });
  await own.getByRole('button', { name: 'Take back my request' }).click();
  await expect(own.getByText(/Take this request back\?/)).toBeVisible();
  await own.getByRole('button', { name: 'Keep it' }).click();
  await expect(own.getByRole('button', { name: 'Take back my request' })).toBeVisible();

  // The keeper accepts.
  await page.goto(`${clubUrl}/requests`);
  const waiting = page.getByRole('listitem', { name: `Request for ${strain} by ${invitee.name}` });
  await expect(waiting).toContainText('For a saison on the first of the month');
  await expect(waiting).toContainText('as agar slant');
  await waiting.getByLabel(`A note for ${invitee.name}`).fill('Bring a cool bag on Sunday');
  await shot(page, 'clubs-handoff-04-keeper-answers');
  await waiting.getByRole('button', { name: 'Accept' }).click();
  await expect(page.getByText('Accepted: waiting for the handover')).toBeVisible();

  // The recipient (still on the requests page) comes back to it later and confirms receipt, which
  // starts their culture under the keeper's.
  await guest.reload();
  const mine = guest.getByRole('listitem', { name: `Request for ${strain} by ${invitee.name}` });
  await expect(mine).toContainText('Bring a cool bag on Sunday');
  await mine.getByLabel('Where you keep it').fill('Garage fridge');
  await mine.getByRole('button', { name: 'I received it' }).click();
  await expect(guest.getByText('It is in your library now')).toBeVisible();
  await shot(guest, 'clubs-handoff-05-received');
  await guest.getByRole('link', { name: 'Open your new culture' }).click();
  await expect(guest.getByRole('heading', { name: strain, level: 1 })).toBeVisible();
  const recipientCultureUrl = guest.url();
  // its page names where it came from and who keeps that, without a link into the keeper's records
  await expect(guest.getByText(`${strain}, kept by ${owner.name}`)).toBeVisible();
  await shot(guest, 'clubs-handoff-05b-grown-from');

  // The lineage shows both owners; the keeper's culture is the strain's path, not a way into their records.
  await guest.getByRole('link', { name: 'Lineage', exact: true }).click();
  await expect(guest.getByRole('treeitem')).toHaveCount(2);
  const keepers = guest.getByRole('region', { name: 'Keepers in this lineage' });
  await expect(keepers).toContainText(owner.name);
  await expect(keepers).toContainText(invitee.name);
  await expect(guest.getByRole('treeitem').nth(0)).toContainText(owner.name.slice(0, 18));
  await expect(guest.getByRole('treeitem').nth(0).getByRole('link')).toHaveCount(0);
  await shot(guest, 'clubs-handoff-06-lineage-two-owners');

  // The activity feed has the listing, the request, the answer and the handover.
  await guest.goto(`${clubUrl}/activity`);
  await expect(guest.getByText(`${invitee.name} received ${strain}`)).toBeVisible();
  await expect(guest.getByText(`${owner.name} listed ${strain} in the bank`)).toBeVisible();

  // The owner confirms contamination in the root.
  await page.goto(rootUrl);
  await page.getByRole('button', { name: 'Contamination confirmed…' }).click();
  const confirm = page.getByRole('region', { name: 'Confirm contamination' });
  await expect(confirm.getByText(/other people keep/)).toBeVisible();
  await confirm.getByLabel(/What did you see/).fill('Film on top, solvent smell');
  await confirm.getByRole('button', { name: /^Quarantine/ }).click();
  await expect(page.getByText(/Quarantined · generation/)).toBeVisible();

  // The recipient is told, and their culture is flagged with where it came from.
  await guest.goto('/notifications');
  await expect(guest.getByText(`Contamination confirmed upstream of ${strain}`)).toBeVisible();
  await shot(guest, 'clubs-handoff-07-notice');
  await guest.goto(recipientCultureUrl);
  await expect(guest.getByText('Suspected contamination')).toBeVisible();
  await expect(guest.getByText(new RegExp(`confirmed in an ancestor, ${strain}`))).toBeVisible();
  await expect(guest.getByText('Film on top, solvent smell')).toHaveCount(0);
  await guest.goto(`${clubUrl}/activity`);
  await expect(guest.getByText(new RegExp(`confirmed contamination in ${strain}`))).toBeVisible();
  await shot(guest, 'clubs-handoff-08-activity');
  await other.close();
});
