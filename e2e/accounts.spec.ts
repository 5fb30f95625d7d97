import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

test('an admin invites a facilitator, who sets a password from the e-mailed link and gets facilitator access only', async ({ page }) => {
  const email = `new-facilitator-${Date.now()}@example.test`;
  const password = 'my-own-long-password';

  // The admin signs in and lands in the admin console.
  await signIn(page, DEMO.admin);
  await expect(page).toHaveURL(/\/admin\/accounts$/);
  await expect(page.getByRole('table', { name: 'Accounts' }).getByText(DEMO.facilitator.email)).toBeVisible();
  await keepScreenshot(page, 'admin-accounts');
  // The only admin is not offered a role change on themself (the server would refuse it).
  await page.getByRole('button', { name: `Actions for ${DEMO.admin.email}` }).click();
  await expect(page.getByRole('menuitem', { name: 'Make facilitator' })).toHaveCount(0);
  await expect(page.getByRole('menuitem', { name: /The only admin/ })).toBeDisabled();
  await page.keyboard.press('Escape');

  // Invite through the dialog; the form says what is wrong before anything is sent.
  await page.getByRole('button', { name: 'Invite a facilitator' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByRole('button', { name: 'Send invitation' }).click();
  await expect(dialog.getByText('Enter the address to send the invitation to.')).toBeVisible();
  await dialog.getByLabel('E-mail').fill(email);
  await dialog.getByLabel(/Name/).fill('Rosa Quillfeather');
  await keepScreenshot(page, 'admin-invite-dialog');
  await dialog.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByText(`Invitation sent to ${email}.`)).toBeVisible();
  await expect(page.getByRole('row', { name: new RegExp(email) }).getByText('Invited')).toBeVisible();

  // The captured e-mail, read in the outbox page (HTML in a sandboxed frame, then the text).
  await page.getByRole('tab', { name: /Outbox/ }).click();
  await page
    .getByRole('row', { name: new RegExp(email) })
    .getByRole('button')
    .click();
  const frame = page.frameLocator('iframe[title="HTML part of the message"]');
  await expect(frame.getByRole('link', { name: 'Set up my account' })).toBeVisible();
  await keepScreenshot(page, 'admin-outbox');
  await page.getByRole('radio', { name: 'Plain text' }).click();
  const text = await page.locator('pre').innerText();
  const link = /https?:\/\/\S+\/account\/accept\?token=[A-Za-z0-9_-]+/.exec(text)?.[0];
  expect(link, text).toBeTruthy();

  await page.getByRole('tab', { name: /Audit log/ }).click();
  await expect(page.getByRole('row', { name: new RegExp(`Invited.*${email}`) })).toBeVisible();
  await expect(page.getByRole('cell', { name: /workshop\.|account\./ })).toHaveCount(0);
  await keepScreenshot(page, 'admin-audit-log');

  // Sign out, then the invited person opens the link.
  await page.getByRole('button', { name: /Ripplehall admin/ }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await expect(page).toHaveURL(/\/sign-in/);
  await page.goto(new URL(link!).pathname + new URL(link!).search);
  await expect(page.getByText(`You were invited as ${email}.`)).toBeVisible();
  await expect(page).not.toHaveURL(/token=/);
  await expect(page.getByLabel('Your name')).toHaveValue('Rosa Quillfeather');
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByLabel('Repeat the password').fill(password + 'x');
  await page.getByRole('button', { name: 'Activate my account' }).click();
  await expect(page.getByText('The two passwords differ.')).toBeVisible();
  await page.getByLabel('Repeat the password').fill(password);
  await keepScreenshot(page, 'accept-invitation');
  await page.getByRole('button', { name: 'Activate my account' }).click();

  // Sign in with the new password: facilitator navigation, no admin.
  await expect(page.getByText('Your account is active. Sign in with your new password.')).toBeVisible();
  await expect(page.getByLabel('E-mail')).toHaveValue(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/rooms/);
  const nav = page.getByRole('navigation', { name: 'Main' });
  await expect(nav.getByRole('link', { name: /Rooms/ })).toBeVisible();
  await expect(nav.getByRole('link', { name: /Workshops/ })).toBeVisible();
  await expect(nav.getByRole('link', { name: /Admin/ })).toHaveCount(0);
  await keepScreenshot(page, 'new-facilitator-home');

  // The admin pages are refused: the client route and the API.
  await page.goto('/admin/accounts');
  await expect(page.getByRole('heading', { name: 'Your account cannot open this page' })).toBeVisible();
  await keepScreenshot(page, 'new-facilitator-admin-refused');
  const api = await page.request.get('/api/admin/accounts');
  expect(api.status()).toBe(403);

  // The same link does not work twice.
  await page.goto(new URL(link!).pathname + new URL(link!).search);
  await expect(page.getByRole('alert')).toContainText('no longer works');
});

test('forgot password: the answer is the same for any address, and the sign-in page links to it', async ({ page }) => {
  await page.goto('/sign-in');
  await expect(page.getByRole('link', { name: 'Sign in' })).toHaveCount(0);
  await page.getByRole('link', { name: 'Forgot your password?' }).click();
  await expect(page).toHaveURL(/\/account\/forgot-password$/);
  await page.getByRole('button', { name: 'Send me a link' }).click();
  await expect(page.getByText('Enter your e-mail address.')).toBeVisible();
  await page.getByLabel('E-mail').fill('nobody-at-all@example.test');
  await page.getByRole('button', { name: 'Send me a link' }).click();
  await expect(page.getByRole('status')).toContainText('If an active account uses that address');
  await keepScreenshot(page, 'forgot-password-sent');
});
