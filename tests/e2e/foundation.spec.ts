import { test, expect } from '@playwright/test';
import { newKeeper, shot, signUpThroughForm } from './support';

test('a new keeper signs up, signs out, resets the password through the fake inbox and signs in', async ({ page }) => {
  const keeper = newKeeper();

  await page.goto('/');
  await expect(page).toHaveURL(/\/sign-in/);
  await shot(page, 'foundation-01-sign-in');

  await signUpThroughForm(page, keeper);
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
  await shot(page, 'foundation-02-home-after-sign-up');

  await page.getByRole('button', { name: /sign out/i }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await shot(page, 'foundation-03-signed-out');

  // wrong password: a clear message, still signed out
  await page.getByLabel('E-mail').fill(keeper.email);
  await page.getByLabel('Password').fill('definitely-wrong');
  await page.getByRole('button', { name: /sign in/i }).click();
  await expect(page.getByRole('alert')).toContainText(/wrong/i);
  await shot(page, 'foundation-04-wrong-password');

  await page.getByRole('link', { name: /forgot/i }).click();
  await expect(page).toHaveURL(/\/forgot-password/);
  await page.getByLabel('E-mail').fill(keeper.email);
  await page.getByRole('button', { name: /send/i }).click();
  await expect(page.getByText(keeper.email)).toBeVisible();
  await shot(page, 'foundation-05-reset-requested');

  await page.goto('/dev/mail');
  const message = page.getByRole('link', { name: /reset your barmkeep password/i }).first();
  await expect(message).toBeVisible();
  await shot(page, 'foundation-06-inbox');
  await message.click();
  const resetLink = page.getByRole('link', { name: /reset-password\?token=/ }).first();
  await expect(resetLink).toBeVisible();
  await shot(page, 'foundation-07-message');
  await resetLink.click();

  await expect(page).toHaveURL(/\/reset-password\?token=/);
  const newPassword = 'a-fresh-long-secret';
  await page.getByLabel('New password').fill('short');
  await page.getByRole('button', { name: /save|set|change/i }).click();
  await expect(page.getByText(/use at least 10/i)).toBeVisible();
  await page.getByLabel('New password').fill(newPassword);
  await page.getByRole('button', { name: /save|set|change/i }).click();
  await shot(page, 'foundation-08-password-changed');

  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(keeper.email);
  await page.getByLabel('Password').fill(newPassword);
  await page.getByRole('button', { name: /sign in/i }).click();
  await expect(page).toHaveURL(/\/$/);
  await expect(page.getByRole('link', { name: /add your first culture/i })).toBeVisible();
  await shot(page, 'foundation-09-empty-home');

  // the home works on a phone-sized screen
  await page.setViewportSize({ width: 360, height: 740 });
  await expect(page.getByRole('link', { name: /add your first culture/i })).toBeVisible();
  await shot(page, 'foundation-10-home-360px');
});

test('sign-up refuses a weak password and a taken e-mail with messages beside the fields', async ({ page }) => {
  const keeper = await test.step('first account', async () => {
    const k = newKeeper();
    await signUpThroughForm(page, k);
    await page.getByRole('button', { name: /sign out/i }).click();
    return k;
  });
  await page.goto('/sign-up');
  await page.getByLabel(/name/i).first().fill('Second Keeper');
  await page.getByLabel('E-mail').fill(keeper.email);
  await page.getByLabel('Password').fill('short');
  await page.getByRole('button', { name: /create account|sign up/i }).click();
  await expect(page.getByText(/use at least 10/i)).toBeVisible();
  await page.getByLabel('Password').fill('long-enough-secret-2');
  await page.getByRole('button', { name: /create account|sign up/i }).click();
  await expect(page.getByText(/already exists/i)).toBeVisible();
  await shot(page, 'foundation-11-taken-email');
  await expect(page).toHaveURL(/\/sign-up/);
});
