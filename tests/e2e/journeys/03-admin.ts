/**
 * The team's own pages: members by e-mailed invitation, roles and the last-admin rule,
 * materials by form and by CSV (with its dry run), line-list import, forgot password, outbox.
 */
import type { Page } from 'playwright-core';
import {
  expect,
  journey,
  newContext,
  openPage,
  readMail,
  screenshot,
  signIn,
  step,
  type E2EJourney,
  type E2EShared,
} from '../harness';

const STEPS = [
  'admin opens the members page from the header',
  'admin invites a new member as checker',
  'the invitation link sets a password and signs the person in as checker',
  'admin changes the new member to designer; the member sees the new role',
  'the last admin cannot demote themself and is told why',
  'admin adds a team material by the form and sees the re-check count',
  'a materials CSV with errors is shown by line and column; the fixed file imports',
  'line-list import: errors by line and column, then a clean preview creates the spools',
  'forgot password mails a link; the new password signs in',
  'the outbox lists the mails',
];

const stamp = Date.now().toString(36);
const NEW_EMAIL = `invitee-${stamp}@spoolwright.test`;
const NEW_NAME = 'Ilse Varga';
const FIRST_PASSWORD = 'ilse-first-password';
const RESET_PASSWORD = 'ilse-second-password';
const MATERIAL_ID = `KX-F-${stamp}`;
const CSV_MATERIAL_ID = `KX-C-${stamp}`;

/** The newest mail to `to` containing `link` that this journey has not read yet, from the server's mailbox folder. */
async function waitForMailText(
  _admin: Page,
  _base: string,
  shared: E2EShared,
  to: string,
  link: RegExp,
): Promise<string> {
  const deadline = Date.now() + 15_000;
  while (Date.now() < deadline) {
    const text = await readMail(shared.dataDir!, to, { timeoutMs: 300 }).catch(() => null);
    if (text && link.test(text) && !seen.has(text)) {
      seen.add(text);
      return text;
    }
    await new Promise((res) => setTimeout(res, 200));
  }
  throw new Error(`no mail to ${to} with ${link}`);
}
/** Mails already followed (each link is used once). */
const seen = new Set<string>();

async function signInAs(page: Page, base: string, email: string, password: string) {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/spools(\?|$)/);
}

export const adminJourney: E2EJourney = {
  name: 'admin pages',
  steps: STEPS,
  async run(browser, base, shared) {
    const adminCtx = await newContext(browser);
    const admin = await openPage(adminCtx);
    const memberCtx = await newContext(browser);
    let member: Page | undefined;
    await journey(
      'admin journey',
      async () => {
        await step(STEPS[0]!, async () => {
          await signIn(admin, base, 'admin@spoolwright.test');
          await admin.getByRole('link', { name: 'Members' }).click();
          await admin.getByRole('heading', { name: 'Team members' }).waitFor();
          await admin
            .locator('[data-testid="members"] tr[data-member="admin@spoolwright.test"]')
            .waitFor();
          await screenshot(admin, 'admin-members');
        });
        await step(STEPS[1]!, async () => {
          const form = admin.getByRole('form', { name: 'Invite a member' });
          await form.getByRole('button', { name: 'Send invitation' }).click();
          await form.getByText('Name must not be empty').waitFor();
          await form.getByLabel('Name').fill(NEW_NAME);
          await form.getByLabel('E-mail').fill(NEW_EMAIL);
          await form.getByLabel('Role').selectOption('checker');
          await form.getByRole('button', { name: 'Send invitation' }).click();
          await admin.getByText(`Invitation sent to ${NEW_EMAIL}`).waitFor();
          await admin
            .locator(
              `[data-testid="invitations"] tr[data-invitation="${NEW_EMAIL}"][data-state="pending"]`,
            )
            .waitFor();
          await screenshot(admin, 'admin-members-invited');
        });
        await step(STEPS[2]!, async () => {
          const text = await waitForMailText(
            admin,
            base,
            shared,
            NEW_EMAIL,
            /accept-invite\?token=/,
          );
          const url = /(https?:\/\/\S+\/accept-invite\?token=[A-Za-z0-9_-]+)/.exec(text)?.[1];
          expect(url?.startsWith(base), `invitation link ${url}`);
          member = await openPage(memberCtx);
          await member.goto(url!);
          await member.getByTestId('invited-role').waitFor();
          expect(
            (await member.getByTestId('invited-role').textContent()) === 'Checker',
            'invited as checker',
          );
          await screenshot(member, 'accept-invite');
          await member.getByLabel('New password').fill(FIRST_PASSWORD);
          await member.getByLabel('Repeat the password').fill(FIRST_PASSWORD);
          await member.getByRole('button', { name: 'Join the team and sign in' }).click();
          await member.waitForURL(/\/spools(\?|$)/);
          await member.getByRole('heading', { name: 'Spool register' }).waitFor();
          const role = await member.getByTestId('role').textContent();
          expect(role?.toLowerCase().includes('checker'), `header shows role "${role}"`);
          // The link works once.
          const again = await openPage(await newContext(browser));
          await again.goto(url!);
          await again.getByText(/already been used/).waitFor();
          await again.context().close();
        });
        await step(STEPS[3]!, async () => {
          await admin.reload();
          const row = admin.locator(`[data-testid="members"] tr[data-member="${NEW_EMAIL}"]`);
          await row.getByLabel(`Role of ${NEW_NAME}`).selectOption('designer');
          await admin.waitForFunction(
            (email) =>
              (
                document.querySelector(
                  `[data-testid="members"] tr[data-member="${email}"] select`,
                ) as HTMLSelectElement | null
              )?.value === 'designer',
            NEW_EMAIL,
          );
          await admin
            .locator(
              `[data-testid="invitations"] tr[data-invitation="${NEW_EMAIL}"][data-state="accepted"]`,
            )
            .waitFor();
          await member!.reload();
          await member!
            .getByTestId('role')
            .filter({ hasText: /designer/i })
            .waitFor();
        });
        await step(STEPS[4]!, async () => {
          const row = admin.locator(
            '[data-testid="members"] tr[data-member="admin@spoolwright.test"]',
          );
          await row.getByText("The team's only admin").waitFor();
          await row.getByLabel(/^Role of /).selectOption('lead');
          await row
            .getByRole('alert')
            .filter({ hasText: 'A team keeps at least one admin' })
            .waitFor();
          const value = await row.locator('select').inputValue();
          expect(value === 'admin', `role stays admin (${value})`);
          await screenshot(admin, 'admin-members-last-admin');
          await row.getByRole('button', { name: /^Remove / }).click();
          await row.getByRole('button', { name: 'Confirm removal' }).click();
          await row.getByRole('alert').filter({ hasText: 'only admin' }).waitFor();
        });
        await step(STEPS[5]!, async () => {
          await admin.getByRole('link', { name: 'Materials' }).click();
          await admin.getByRole('heading', { name: 'Materials library' }).waitFor();
          await admin
            .locator('[data-testid="materials"] tr[data-material="A106-B"][data-origin="library"]')
            .waitFor();
          await screenshot(admin, 'admin-materials');
          const form = admin.getByRole('form', { name: 'Add a team material' });
          await form.getByRole('button', { name: 'Add material' }).click();
          await form.getByText(/^Source note give the source/).waitFor();
          await form.getByLabel('Material id').fill(MATERIAL_ID);
          await form.getByLabel('Specification').fill('Owner spec KX');
          await form.getByLabel('Grade').fill('F');
          await form.getByLabel(/^Tensile strength/).fill('60');
          await form.getByLabel(/^Yield strength/).fill('35');
          // Invented values for the journey, not from any table.
          await form.getByLabel(/^Row 1: temperature/).fill('100');
          await form.getByLabel(/^Row 1: allowable stress/).fill('20');
          await form.getByRole('button', { name: 'Add a temperature row' }).click();
          await form.getByLabel(/^Row 2: temperature/).fill('400');
          await form.getByLabel(/^Row 2: allowable stress/).fill('19.5');
          await form
            .getByLabel('Source note', { exact: true })
            .fill('Owner spec KX rev C, table 2');
          await form.getByLabel(/recalled from memory/).check();
          await form.getByRole('button', { name: 'Add material' }).click();
          // The re-check runs as a background job: the note counts up, then says how many.
          await form.locator('[data-testid="rechecked"]:not([data-running])').waitFor();
          const note = await form.getByTestId('rechecked').textContent();
          expect(/^\d+ spools? re-checked/.test(note ?? ''), `re-check note "${note}"`);
          const row = admin.locator(
            `[data-testid="materials"] tr[data-material="${MATERIAL_ID}"][data-origin="team"]`,
          );
          await row.getByText('Owner spec KX rev C, table 2').waitFor();
          expect(
            (await row.locator('[data-from-memory]').textContent()) === 'yes',
            'from-memory flag shown',
          );
        });
        await step(STEPS[6]!, async () => {
          const bad = `id,spec,grade,tensile_ksi,yield_ksi,temp_f,stress_ksi\n${CSV_MATERIAL_ID},Owner spec KX,C,60,35,100,20\n${CSV_MATERIAL_ID},Owner spec KX,C,60,35,300,abc\n`;
          await admin.getByLabel('CSV file', { exact: true }).setInputFiles({
            name: 'materials.csv',
            mimeType: 'text/csv',
            buffer: Buffer.from(bad),
          });
          await admin.getByLabel('Source note for the file').fill('Owner spec KX rev C, table 3');
          await admin.getByRole('button', { name: 'Check the file' }).click();
          const issue = admin.locator(
            '[data-testid="csv-issues"] tr[data-line="3"][data-column="stress_ksi"]',
          );
          await issue.waitFor();
          await issue.scrollIntoViewIfNeeded();
          await screenshot(admin, 'admin-materials-csv-errors');
          expect(
            (await admin.getByRole('button', { name: /^Import \d/ }).count()) === 0,
            'no import while the file has problems',
          );
          const fixed = bad.replace(',300,abc', ',300,19.8');
          await admin.getByLabel('CSV file', { exact: true }).setInputFiles({
            name: 'materials.csv',
            mimeType: 'text/csv',
            buffer: Buffer.from(fixed),
          });
          await admin.getByRole('button', { name: 'Check the file' }).click();
          await admin.getByTestId('materials-preview').waitFor();
          await admin.getByRole('button', { name: 'Import 1 material' }).click();
          await admin.getByText(/^Imported 1 material/).waitFor();
          await admin
            .locator(
              `[data-testid="materials"] tr[data-material="${CSV_MATERIAL_ID}"][data-origin="team"]`,
            )
            .waitFor();
        });
        await step(STEPS[7]!, async () => {
          await admin.getByRole('link', { name: 'Line-list import' }).click();
          await admin.getByRole('heading', { name: 'Line-list import' }).waitFor();
          const names = [`LL-${stamp}-1`, `LL-${stamp}-2`];
          const bad = `name,line,pressure,temperature,material\n${names[0]},2"-P-${stamp}-1,150,100,A106-B\n${names[1]},2"-P-${stamp}-2,high,100,A106-B\n`;
          await admin.getByLabel('Line-list CSV').setInputFiles({
            name: 'line-list.csv',
            mimeType: 'text/csv',
            buffer: Buffer.from(bad),
          });
          await admin.getByRole('button', { name: 'Check the file' }).click();
          await admin
            .locator('[data-testid="csv-issues"] tr[data-line="3"][data-column="pressure"]')
            .waitFor();
          expect(
            (await admin.getByRole('button', { name: /^Create \d/ }).count()) === 0,
            'nothing to create while a cell is bad',
          );
          await screenshot(admin, 'admin-line-list-errors');
          const good = bad.replace(',high,', ',150,');
          await admin.getByLabel('Line-list CSV').setInputFiles({
            name: 'line-list.csv',
            mimeType: 'text/csv',
            buffer: Buffer.from(good),
          });
          await admin.getByRole('button', { name: 'Check the file' }).click();
          await admin.locator('[data-testid="line-list-preview"] tr[data-line="3"]').waitFor();
          await screenshot(admin, 'admin-line-list-preview');
          await admin.getByRole('button', { name: 'Create 2 spools' }).click();
          await admin.getByText(/^Created 2 spools/).waitFor();
          await admin.getByRole('link', { name: 'Spool register' }).click();
          await admin.getByLabel('Find spools').fill(`LL-${stamp}`);
          await admin.getByRole('link', { name: names[1]! }).waitFor();
        });
        await step(STEPS[8]!, async () => {
          const ctx = await newContext(browser);
          const page = await openPage(ctx);
          await page.goto(`${base}/sign-in`);
          await page.getByRole('link', { name: 'Forgot password?' }).click();
          await page.waitForURL(/\/forgot-password/);
          await page.getByLabel('Email').fill(NEW_EMAIL);
          await page.getByRole('button', { name: 'Send the reset link' }).click();
          await page.getByText(/a link is on its way/).waitFor();
          await screenshot(page, 'forgot-password');
          const text = await waitForMailText(
            admin,
            base,
            shared,
            NEW_EMAIL,
            /reset-password\?token=/,
          );
          const url = /(https?:\/\/\S+\/reset-password\?token=[^\s]+)/.exec(text)?.[1];
          expect(url?.startsWith(base), `reset link ${url}`);
          await page.goto(url!);
          await page.getByLabel('New password').waitFor();
          await screenshot(page, 'reset-password');
          await page.getByLabel('New password').fill(RESET_PASSWORD);
          await page.getByLabel('Repeat the password').fill(RESET_PASSWORD);
          await page.getByRole('button', { name: 'Set the new password' }).click();
          await page.getByText(/Your password has been changed/).waitFor();
          await page.getByRole('link', { name: 'Sign in with the new password' }).click();
          await signInAs(page, base, NEW_EMAIL, RESET_PASSWORD);
          await page
            .getByTestId('role')
            .filter({ hasText: /designer/i })
            .waitFor();
          await ctx.close();
        });
        await step(STEPS[9]!, async () => {
          await admin.getByRole('link', { name: 'Outbox' }).click();
          await admin.getByRole('heading', { name: 'Outbox' }).waitFor();
          const item = admin
            .locator(`[data-testid="outbox"] li[data-mail-to*="${NEW_EMAIL}"]`)
            .filter({ hasText: 'invited' })
            .first();
          await item.waitFor();
          await item.getByRole('button').click();
          await item.getByText(/Hello Ilse Varga/).waitFor();
          const shown = (await item.locator('pre').textContent()) ?? '';
          expect(
            shown.includes('accept-invite?token=[hidden]'),
            'the invitation token is not shown in the outbox',
          );
          await screenshot(admin, 'admin-outbox');
        });
      },
      STEPS,
    );
    await memberCtx.close();
    await adminCtx.close();
  },
};
