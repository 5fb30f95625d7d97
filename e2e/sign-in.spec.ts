import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

test('the demo facilitator signs in and sees the facilitator navigation', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  await expect(page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /Rooms/ })).toBeVisible();
  await expect(page.getByRole('link', { name: /Admin/ })).toHaveCount(0);
  await keepScreenshot(page, 'facilitator-home');
});

test('a wrong password gets a message that does not reveal the account', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill('nobody@ripplehall.local');
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toHaveText('That e-mail and password do not match an active account.');
});

test('a failed sign-in leaves no error message behind on the next page', async ({ page }) => {
  await page.goto('/sign-in');
  await page.getByLabel('E-mail').fill(DEMO.facilitator.email);
  await page.getByLabel('Password').fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.getByRole('alert')).toContainText('do not match');
  await page.getByLabel('Password').fill(DEMO.facilitator.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/rooms/);
  await expect(page.getByRole('heading', { name: 'Rooms' })).toBeVisible();
  await expect(page.locator('mat-snack-bar-container')).toHaveCount(0);
});
