import { expect, type Page, type APIRequestContext } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { randomBytes } from 'node:crypto';

const SHOTS = path.resolve(import.meta.dirname, '../artifacts/screenshots');
mkdirSync(SHOTS, { recursive: true });

/** Save a full-page screenshot under tests/artifacts/screenshots (git-ignored). */
export async function shot(page: Page, name: string) {
  await page.screenshot({ path: path.join(SHOTS, `${name}.png`), fullPage: true });
}

export function newKeeper() {
  const tag = `${Date.now()}-${randomBytes(3).toString('hex')}`;
  return { name: `Test Keeper ${tag.slice(-4)}`, email: `keeper-${tag}@example.test`, password: 'long-enough-secret' };
}

/** Sign up through the real form; leaves the page on the signed-in home. */
export async function signUpThroughForm(page: Page, keeper = newKeeper()) {
  await page.goto('/sign-up');
  await page.getByLabel(/name/i).first().fill(keeper.name);
  await page.getByLabel(/e-mail/i).fill(keeper.email);
  await page
    .getByLabel(/password/i)
    .first()
    .fill(keeper.password);
  await page.getByRole('button', { name: /create account|sign up/i }).click();
  await expect(page).toHaveURL(/\/$/);
  return keeper;
}

/** Read the newest message to an address from the fake inbox API. */
export async function latestMailTo(request: APIRequestContext, to: string) {
  for (let i = 0; i < 40; i++) {
    const res = await request.get('/api/dev/mail');
    const { messages } = (await res.json()) as {
      messages: { id: string; to: string[]; subject: string; text: string }[];
    };
    const m = messages.find((x) => x.to.includes(to));
    if (m) return m;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`no mail to ${to}`);
}
