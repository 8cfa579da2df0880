import { test, expect } from '@playwright/test';
import { newKeeper, shot, signUpThroughForm } from './support';

test('an owner starts a club and invites by e-mail; the invitee signs up from the link in /dev/mail and joins', async ({
  page,
  browser,
}) => {
  const owner = newKeeper();
  const invitee = newKeeper();
  const clubName = `Lockside Ferment Circle ${invitee.email.slice(7, 13)}`;

  await signUpThroughForm(page, owner);
  await page.getByRole('link', { name: 'Clubs' }).first().click();
  await expect(page.getByRole('heading', { name: 'Clubs', level: 1 })).toBeVisible();

  // a bad name is refused beside the field
  await page.getByRole('button', { name: 'Start the club' }).click();
  await expect(page.getByText(/at least 2 characters/i)).toBeVisible();
  await page.getByLabel('Club name').fill(clubName);
  await page.getByLabel('About the club').fill('Invented for a browser test. We swap jars on the first Sunday.');
  await page.getByRole('button', { name: 'Start the club' }).click();
  await expect(page.getByRole('heading', { name: clubName, level: 1 })).toBeVisible();
  await expect(page.getByText('Owner').first()).toBeVisible();
  await shot(page, 'clubs-01-new-club');

  await page.getByRole('link', { name: 'Invitations' }).click();
  await page.getByLabel('Their e-mail').fill('not-an-address');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(/valid e-mail/i)).toBeVisible();
  await page.getByLabel('Their e-mail').fill(owner.email);
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(/already belongs to the club/i)).toBeVisible();
  await page.getByLabel('Their e-mail').fill(invitee.email);
  await page.getByLabel('A note for them').fill('Bring a clean jar.');
  await page.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${invitee.email}`)).toBeVisible();
  await expect(page.getByRole('listitem').filter({ hasText: invitee.email })).toContainText('Waiting');
  await shot(page, 'clubs-02-invitation-sent');

  // the invitee, in a browser of their own, finds the mail in the fake inbox
  const other = await browser.newContext();
  const guest = await other.newPage();
  await guest.goto('/dev/mail');
  const mail = guest.getByRole('link', { name: new RegExp(`invited you to ${clubName}`) }).first();
  await expect(mail).toBeVisible();
  await mail.click();
  await expect(guest.getByText('Bring a clean jar.')).toBeVisible();
  await shot(guest, 'clubs-03-invitation-mail');
  const link = guest.getByRole('link', { name: /\/invitation\?token=/ }).first();
  const href = await link.getAttribute('href');
  expect(href).toBeTruthy();
  await link.click();

  await expect(guest).toHaveURL(/\/invitation\?token=/);
  await expect(guest.getByRole('heading', { name: `Join ${clubName}` })).toBeVisible();
  await expect(guest.getByText(invitee.email).first()).toBeVisible();
  await guest.getByRole('button', { name: 'Create account and join' }).click();
  await expect(guest.getByText('Enter your name')).toBeVisible();
  await shot(guest, 'clubs-04-sign-up-through-link-errors');
  await guest.getByLabel('Your name').fill(invitee.name);
  await guest.getByLabel('Password', { exact: true }).fill(invitee.password);
  await guest.getByRole('button', { name: 'Create account and join' }).click();

  await expect(guest.getByRole('heading', { name: clubName, level: 1 })).toBeVisible();
  await expect(guest.getByText('Member').first()).toBeVisible();
  await guest.getByRole('link', { name: 'Members' }).click();
  const rows = guest.getByRole('row');
  await expect(rows.filter({ hasText: owner.name })).toContainText('Owner');
  await expect(rows.filter({ hasText: invitee.name })).toContainText('Member');
  // a member sees no e-mail addresses and no invitations tab
  await expect(guest.getByRole('columnheader', { name: 'E-mail' })).toHaveCount(0);
  await expect(guest.getByRole('link', { name: 'Invitations' })).toHaveCount(0);
  await shot(guest, 'clubs-05-invitee-members');

  // the link works once
  await guest.goto(href!);
  await expect(guest.getByText(/already used/i)).toBeVisible();
  await shot(guest, 'clubs-06-link-used');
  await other.close();

  // the owner sees that the invitation was used, and cannot leave as the only owner
  await page.reload();
  await expect(page.getByRole('listitem').filter({ hasText: invitee.email })).toContainText('Joined');
  await page.getByRole('link', { name: 'About' }).click();
  await page.getByRole('button', { name: /leave the club/i }).click();
  await page.getByRole('button', { name: new RegExp(`yes, leave`, 'i') }).click();
  await expect(page.getByRole('alert')).toContainText(/at least one owner/i);
  await shot(page, 'clubs-07-last-owner');
});
