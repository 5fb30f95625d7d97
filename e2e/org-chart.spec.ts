import { readFileSync, writeFileSync } from 'node:fs';
import { DEMO, expect, keepScreenshot, signIn, test } from './fixtures';

/** "From an org chart": pick the columns from a preview, read the per-row errors, fix, import, export the same CSV back. */
const GOOD = [
  'Worker,Given name,Line manager,Team',
  'w1,Ilse Marrow,,Leadership',
  'w2,Joss Penhale,w1,Studio',
  'w3,Kit Arden,w1,Workshop',
  'w4,Lale Crane,w2,Studio',
  'w5,Mo Ferris,w2,Studio',
  'w6,Nell Ostrey,w3,Workshop',
  '',
].join('\r\n');
const BAD = GOOD.replace('w6,Nell Ostrey,w3', 'w6,Nell Ostrey,w9').replace('w2,Joss Penhale,w1', 'w2,Joss Penhale,w4');

test('an org chart becomes a room: choose columns, read row errors, fix, import, export it back', async ({ page }) => {
  await signIn(page, DEMO.facilitator);
  const dir = test.info().outputPath();
  writeFileSync(`${dir}/chart-bad.csv`, BAD);
  writeFileSync(`${dir}/chart.csv`, GOOD);

  await page.goto('/rooms');
  await page.getByRole('button', { name: 'Import a file' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('Room name').fill('Studio org chart');
  await dialog.getByRole('radio', { name: 'From an org chart' }).check();
  // The org chart has its own file picker: files go to it only once it has replaced the ties picker.
  await expect(dialog.getByText('Org chart CSV', { exact: true })).toBeVisible();
  await expect(dialog.getByText('Ties CSV', { exact: true })).toHaveCount(0);
  await dialog.getByTestId('import-main').setInputFiles(`${dir}/chart-bad.csv`);

  // The header is read at once: a preview, and pickers for the columns ("Worker" is not a name the server knows).
  const preview = dialog.getByRole('table', { name: 'First rows of the org chart' });
  await expect(preview.getByRole('columnheader', { name: 'Line manager' })).toBeVisible();
  await expect(preview.getByRole('cell', { name: 'Ilse Marrow' })).toBeVisible();
  await expect(dialog.getByLabel('Manager and each report')).toHaveValue('3');
  await expect(dialog.getByLabel('Two people with the same manager')).toHaveValue('1');
  await expect(dialog.getByText('take these ties as a starting point')).toBeVisible();
  await dialog.getByRole('combobox', { name: 'Person id' }).click();
  await page.getByRole('option', { name: 'Worker' }).click();
  await dialog.getByRole('combobox', { name: 'Manager (their id)' }).click();
  await page.getByRole('option', { name: 'Line manager' }).click();
  await dialog.getByRole('combobox', { name: /^Name/ }).click();
  await page.getByRole('option', { name: 'Given name' }).click();
  await dialog.getByRole('combobox', { name: /^Department/ }).click();
  await page.getByRole('option', { name: 'Team' }).click();
  await dialog.getByLabel('Two people with the same manager').fill('2');
  await dialog.getByRole('button', { name: 'Check file' }).click();

  const issues = dialog.getByRole('table', { name: 'Problems found in the file' });
  // w2 -> w4 -> w2 loops (lines 3 and 5); w6 names a manager w9 who is not in the file (line 7).
  await expect(issues.getByRole('row').filter({ hasText: 'line 3' })).toContainText('reporting line loops');
  await expect(issues.getByRole('row').filter({ hasText: 'line 5' })).toContainText('reporting line loops');
  await expect(issues.getByRole('row').filter({ hasText: 'line 7' })).toContainText('the manager "w9" of "w6" is not a person');
  await expect(dialog.getByRole('button', { name: 'Import', exact: true })).toBeDisabled();
  await keepScreenshot(page, 'org-chart-errors');

  // The fixed file keeps the chosen columns.
  await dialog.getByTestId('import-main').setInputFiles(`${dir}/chart.csv`);
  await expect(preview.getByRole('cell', { name: 'Mo Ferris' })).toBeVisible();
  await dialog.getByRole('button', { name: 'Check file' }).click();
  await expect(dialog.getByText('Ready to import')).toBeVisible();
  // 5 reporting lines; peers {w2,w3} and {w4,w5}.
  await expect(dialog.getByTestId('import-counts')).toContainText('6 people · 7 ties · 3 groups');
  await dialog.getByRole('button', { name: 'Import', exact: true }).click();
  await page.waitForURL(/\/rooms\/\d+$/);
  await expect(page.getByText('6 people · 7 ties', { exact: true })).toBeVisible();
  await expect(page.locator('g.person[data-name="Lale Crane"]')).toBeVisible();
  await keepScreenshot(page, 'org-chart-room');

  await page.getByRole('button', { name: 'Export' }).click();
  const download = page.waitForEvent('download');
  await page.getByRole('menuitem', { name: 'Org chart (CSV)' }).click();
  const path = `${dir}/back.csv`;
  await (await download).saveAs(path);
  expect(readFileSync(path, 'utf8').replace(/^\uFEFF/, '')).toBe(GOOD);
});
