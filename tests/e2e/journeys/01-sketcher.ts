/**
 * The sketcher journeys: draw, check, fix, save, conflicts, import/export, team material,
 * checker and lead refusals.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import {
  expect,
  journey,
  newContext,
  openPage,
  PASSWORD,
  projectElement,
  RESULTS,
  signIn,
  statusOf,
  step,
  STEP_TIMEOUT,
  type E2EJourney,
  type E2EShared,
} from '../harness';

const DESIGNER_STEPS = [
  'designer signs in and sees who they are',
  'creates a spool and opens the sketcher',
  'draws four legs and sees the bends inserted',
  'a design pressure makes a bend fail',
  'clicks the failing bend on the canvas and reads the governing case',
  'applies the lightest passing schedule and sees the bend pass',
  'saves, reloads and finds the change kept',
  'finds the spool in the register',
];
const FABRICATOR_STEPS = ['fabricator signs in', 'opens the spool and finds editing unavailable'];
const MORE_STEPS = [
  'undo and redo by keyboard',
  'metric display shows mm and MPa without changing the stored values',
  'leaving with unsaved changes asks first',
  'a stale save shows what differs and can load the saved version',
  'submits the spool for check',
  'export downloads the document; import brings one back and reports bad files by field',
];
const MATERIAL_STEPS = [
  'a team material imported by the admin is offered and checked in the sketcher',
];
const REVIEW_STEPS = [
  'checker marks the spool checked (and cannot edit it)',
  'lead cannot release it while bends fail',
];

async function designerJourney(ctx: BrowserContext, base: string, shared: E2EShared) {
  const page = await openPage(ctx);
  await journey(
    'designer journey',
    async () => {
      await step(DESIGNER_STEPS[0]!, async () => {
        await signIn(page, base, 'designer@spoolwright.test');
        const role = await page.getByTestId('role').textContent();
        expect(role?.toLowerCase().includes('designer'), `header shows role "${role}"`);
      });
      await step(DESIGNER_STEPS[1]!, async () => {
        await page.getByRole('button', { name: '+ New spool' }).click();
        await page.waitForURL(/\/spools\/[^/?]+$/);
        await page.getByTestId('sketcher').waitFor();
        shared.spoolId = page.url().split('/').pop()!;
        const name = `E2E spool ${Date.now()}`;
        shared.spoolName = name;
        const nameBox = page.getByLabel('Spool name');
        await nameBox.fill(name);
        await nameBox.press('Enter');
      });
      await step(DESIGNER_STEPS[2]!, async () => {
        await page.getByLabel('Leg length').fill('36');
        await page.getByRole('button', { name: 'Draw leg East' }).click();
        await page.getByRole('button', { name: 'Draw leg North' }).click();
        // the keyboard draws too: PageUp is "up"
        await page.locator('body').click({ position: { x: 5, y: 5 } });
        await page.keyboard.press('PageUp');
        await page.getByRole('button', { name: 'Draw leg East' }).click();
        const rows = page.locator('[data-testid="element-table"] tbody tr');
        await page.waitForFunction(
          () => document.querySelectorAll('[data-testid="element-table"] tbody tr').length === 7,
          null,
          { timeout: STEP_TIMEOUT },
        );
        const kinds = await rows.evaluateAll((trs) =>
          trs.map((tr) => tr.getAttribute('data-element-id')),
        );
        expect(
          JSON.stringify(kinds) === JSON.stringify(['S1', 'B1', 'S2', 'B2', 'S3', 'B3', 'S4']),
          `elements are ${kinds.join(',')}`,
        );
      });
      await step(DESIGNER_STEPS[3]!, async () => {
        await page.getByRole('tab', { name: 'Design conditions' }).click();
        const p = page.getByLabel(/Internal design pressure/);
        await p.fill('1100');
        await page.getByRole('button', { name: 'Apply conditions' }).click();
        await page.waitForFunction(
          () =>
            document
              .querySelector(
                '[data-testid="element-table"] tr[data-element-id="B1"] [data-check-status]',
              )
              ?.getAttribute('data-check-status') === 'fail',
          null,
          { timeout: STEP_TIMEOUT },
        );
      });
      await step(DESIGNER_STEPS[4]!, async () => {
        let clicked = false;
        const canvas = page.locator('canvas');
        if ((await canvas.count()) > 0) {
          await page.getByRole('button', { name: 'Fit' }).click();
          await page.waitForTimeout(500);
          const pt = await projectElement(page, 'B1');
          if (pt) {
            await page.mouse.click(pt.x, pt.y);
            clicked = true;
          }
        }
        if (!clicked) {
          console.log('      (no canvas hook: selecting from the element list)');
          await page.locator('[data-testid="element-table"] tr[data-element-id="B1"]').click();
        }
        await page.locator('[data-testid="inspector"][data-element-id="B1"]').waitFor();
        const governing = await page.getByTestId('governing-case').textContent();
        expect(governing?.includes('intrados'), `governing case is "${governing}"`);
      });
      await step(DESIGNER_STEPS[5]!, async () => {
        const lightest = (await page.getByTestId('lightest-schedule').textContent())?.trim();
        expect(
          lightest && lightest !== '' && !lightest.startsWith('none'),
          `lightest schedule "${lightest}"`,
        );
        await page.getByRole('button', { name: `Use schedule ${lightest}` }).click();
        await page.waitForFunction(
          () =>
            document
              .querySelector(
                '[data-testid="element-table"] tr[data-element-id="B1"] [data-check-status]',
              )
              ?.getAttribute('data-check-status') === 'pass',
          null,
          { timeout: STEP_TIMEOUT },
        );
        fs.mkdirSync(RESULTS, { recursive: true });
        await page.screenshot({ path: path.join(RESULTS, 'sketcher.png') });
      });
      await step(DESIGNER_STEPS[6]!, async () => {
        await page.getByRole('button', { name: 'Save', exact: true }).click();
        await page.getByRole('button', { name: 'Saved', exact: true }).waitFor();
        await page.reload();
        await page.getByTestId('sketcher').waitFor();
        await page.locator('[data-testid="element-table"] tr[data-element-id="B1"]').waitFor();
        expect(
          (await statusOf(page, 'B1')) === 'pass',
          `after reload B1 is ${await statusOf(page, 'B1')}`,
        );
        expect(
          (await statusOf(page, 'B2')) === 'fail',
          `after reload B2 is ${await statusOf(page, 'B2')}`,
        );
      });
      await step(DESIGNER_STEPS[7]!, async () => {
        await page.getByRole('link', { name: 'Spool register' }).click();
        await page.getByLabel('Find spools').fill(shared.spoolName!);
        await page.locator(`[data-spool-id="${shared.spoolId}"]`).waitFor();
        const rowText = await page.locator(`[data-spool-id="${shared.spoolId}"]`).textContent();
        expect(rowText?.includes(shared.spoolName!), `register row reads "${rowText}"`);
        // the weakest element links into the sketcher with that element selected
        const worst = page.locator(`[data-spool-id="${shared.spoolId}"] a[href*="element="]`);
        const worstId = (await worst.textContent())?.trim();
        await worst.click();
        await page.locator(`[data-testid="inspector"][data-element-id="${worstId}"]`).waitFor();
        expect(
          (await statusOf(page, worstId!)) === 'fail',
          `weakest element ${worstId} is ${await statusOf(page, worstId!)}`,
        );
      });
    },
    DESIGNER_STEPS,
  );
  await page.close();
}

async function fabricatorJourney(ctx: BrowserContext, base: string, shared: E2EShared) {
  const page = await openPage(ctx);
  await journey(
    'fabricator journey',
    async () => {
      await step(FABRICATOR_STEPS[0]!, async () => {
        await signIn(page, base, 'fabricator@spoolwright.test');
        expect(
          (await page.getByRole('button', { name: '+ New spool' }).count()) === 0,
          'the "New spool" button is shown to a fabricator',
        );
      });
      await step(FABRICATOR_STEPS[1]!, async () => {
        expect(shared.spoolId, 'no spool from the designer journey');
        await page.goto(`${base}/spools/${shared.spoolId}`);
        await page.getByTestId('view-only').waitFor();
        expect(
          (await page.getByRole('button', { name: /^Draw leg/ }).count()) === 0,
          'draw buttons are shown',
        );
        expect(
          (await page.getByRole('button', { name: /^Save/ }).count()) === 0,
          'a save button is shown',
        );
        expect(await page.getByLabel('Spool name').isDisabled(), 'the name box is editable');
        await page.locator('[data-testid="element-table"] tr[data-element-id="B1"]').click();
        await page.locator('[data-testid="inspector"][data-element-id="B1"]').waitFor();
        expect(await page.getByLabel('Schedule').isDisabled(), 'the schedule picker is editable');
        expect(
          (await page.getByRole('button', { name: /^Use schedule/ }).count()) === 0,
          'the "use it" button is shown',
        );
      });
    },
    FABRICATOR_STEPS,
  );
  await page.close();
}

const rowCount = (page: Page) => page.locator('[data-testid="element-table"] tbody tr').count();

async function waitRows(page: Page, n: number): Promise<void> {
  await page.waitForFunction(
    (want) => document.querySelectorAll('[data-testid="element-table"] tbody tr').length === want,
    n,
    { timeout: STEP_TIMEOUT },
  );
}

async function moreDesignerJourney(ctx: BrowserContext, base: string, shared: E2EShared) {
  const page = await openPage(ctx);
  await journey(
    'designer: history, units, guards, conflicts, lifecycle, files',
    async () => {
      await step(MORE_STEPS[0]!, async () => {
        expect(shared.spoolId, 'no spool from the designer journey');
        await signIn(page, base, 'designer@spoolwright.test');
        await page.goto(`${base}/spools/${shared.spoolId}`);
        await waitRows(page, 7);
        await page.getByLabel('Leg length').fill('24');
        await page.getByRole('button', { name: 'Draw leg South' }).click();
        await waitRows(page, 9);
        await page.locator('body').click({ position: { x: 5, y: 5 } });
        await page.keyboard.press('Control+z');
        await waitRows(page, 7);
        await page.keyboard.press('Control+Shift+z');
        await waitRows(page, 9);
        await page.keyboard.press('Control+z');
        await waitRows(page, 7);
        // a reversal is refused with a message
        await page.getByRole('button', { name: 'Draw leg West' }).click();
        const notice = await page.getByTestId('edit-notice').textContent();
        expect(notice?.includes('double back'), `refusal reads "${notice}"`);
      });
      await step(MORE_STEPS[1]!, async () => {
        await page.locator('[data-units="metric"]').click();
        await page.getByText('Leg length (mm)').waitFor();
        const s1 = await page
          .locator('[data-testid="element-table"] tr[data-element-id="S1"]')
          .textContent();
        // S1 cut length 33 in = 838.2 mm
        expect(s1?.includes('838.2 mm'), `S1 row reads "${s1}"`);
        await page.getByRole('tab', { name: 'Design conditions' }).click();
        // 1100 psi = 7.58423 MPa
        const p = await page.getByLabel(/Internal design pressure/).inputValue();
        expect(p === '7.58423', `pressure shows "${p}"`);
        expect(
          (await page.getByTestId('dirty').count()) === 0,
          'switching units made the spool dirty',
        );
        await page.locator('[data-units="imperial"]').click();
        await page.getByText('Leg length (in)').waitFor();
      });
      await step(MORE_STEPS[2]!, async () => {
        await page.getByRole('button', { name: 'Draw leg South' }).click();
        await waitRows(page, 9);
        await page.getByRole('link', { name: 'Spool register' }).click();
        await page.getByRole('alertdialog', { name: 'Unsaved changes' }).waitFor();
        await page.getByRole('button', { name: 'Stay' }).click();
        expect(page.url().endsWith(`/spools/${shared.spoolId}`), `left to ${page.url()}`);
        // signing out is a navigation too, so it asks before the session ends
        await page.getByRole('button', { name: 'Sign out' }).click();
        await page.getByRole('alertdialog', { name: 'Unsaved changes' }).waitFor();
        await page.getByRole('button', { name: 'Stay' }).click();
        expect(
          (await page.getByTestId('role').count()) === 1,
          'signed out although the user chose to stay',
        );
        expect((await rowCount(page)) === 9, 'the edit was lost');
      });
      await step(MORE_STEPS[3]!, async () => {
        // someone else saves first
        const res = await page.request.get(`${base}/api/spools/${shared.spoolId}`);
        expect(res.ok(), `GET spool ${res.status()}`);
        const current = (await res.json()) as {
          version: number;
          document: {
            conditions: Record<string, unknown>;
            elements: { id: string; tag?: string }[];
          };
        };
        const theirs = {
          ...current.document,
          conditions: { ...current.document.conditions, temperature: 250 },
          elements: current.document.elements.map((e) =>
            e.id === 'S2' ? { ...e, tag: 'changed elsewhere' } : e,
          ),
        };
        const put = await page.request.put(`${base}/api/spools/${shared.spoolId}`, {
          data: { document: theirs, baseVersion: current.version },
          headers: { Origin: base },
        });
        expect(put.ok(), `PUT by the other editor answered ${put.status()} ${await put.text()}`);
        await page.getByRole('button', { name: 'Save', exact: true }).click();
        const panel = page.getByTestId('conflict');
        await panel.waitFor();
        const text = (await page.getByTestId('conflict-changes').textContent()) ?? '';
        for (const want of [
          'conditions: differs in temperature',
          'S2: differs in tag',
          'S4: differs in length',
          'only in yours',
        ]) {
          expect(text.includes(want), `conflict list lacks "${want}": ${text}`);
        }
        await page.getByRole('button', { name: /Load the saved version/ }).click();
        await waitRows(page, 7);
        expect(
          (await page.getByTestId('dirty').count()) === 0,
          'still dirty after loading the saved version',
        );
      });
      await step(MORE_STEPS[4]!, async () => {
        await page.getByRole('button', { name: 'Submit for check' }).click();
        await page.locator('[data-lifecycle="submitted"]').waitFor();
        expect(
          (await page.getByRole('button', { name: 'Mark checked' }).count()) === 0,
          'a designer is offered "Mark checked"',
        );
      });
      await step(MORE_STEPS[5]!, async () => {
        const [download] = await Promise.all([
          page.waitForEvent('download'),
          page.getByRole('button', { name: 'Export' }).click(),
        ]);
        const file = await download.path();
        const doc = JSON.parse(fs.readFileSync(file, 'utf8')) as {
          elements: { id: string }[];
          conditions: { temperature: number };
        };
        expect(
          doc.elements.length === 7 && doc.conditions.temperature === 250,
          `exported ${doc.elements.length} elements, T ${doc.conditions.temperature}`,
        );
        const shorter = { ...doc, elements: doc.elements.slice(0, 5) };
        await page.getByTestId('import-input').setInputFiles({
          name: 'shorter.spool.json',
          mimeType: 'application/json',
          buffer: Buffer.from(JSON.stringify(shorter)),
        });
        await waitRows(page, 5);
        await page.getByTestId('dirty').waitFor();
        const bad = {
          ...doc,
          elements: [{ id: 'X1', kind: 'straight', nps: '2', schedule: '40', length: -3 }],
        };
        await page.getByTestId('import-input').setInputFiles({
          name: 'bad.json',
          mimeType: 'application/json',
          buffer: Buffer.from(JSON.stringify(bad)),
        });
        const alert = page.getByText('Not imported:').locator('..');
        await alert.waitFor();
        const alertText = await alert.textContent();
        expect(alertText?.includes('elements[0].length'), `import error reads "${alertText}"`);
        expect((await rowCount(page)) === 5, 'a bad file changed the sketch');
      });
    },
    MORE_STEPS,
  );
  await page.close();
}

const TEAM_MATERIAL_CSV = [
  'id,spec,grade,name,tensile_ksi,yield_ksi,temp_f,stress_ksi',
  // invented test values, not a real specification
  'E2E-CS1,E2E test spec,1,Test carbon steel,60,35,100,20',
  'E2E-CS1,E2E test spec,1,Test carbon steel,60,35,400,20',
].join('\n');

async function teamMaterialJourney(ctx: BrowserContext, base: string) {
  const page = await openPage(ctx);
  await journey(
    'team materials',
    async () => {
      await step(MATERIAL_STEPS[0]!, async () => {
        const signin = await ctx.request.post(`${base}/api/auth/sign-in/email`, {
          data: { email: 'admin@spoolwright.test', password: PASSWORD },
          headers: { Origin: base },
        });
        expect(signin.ok(), `admin sign-in answered ${signin.status()}`);
        const up = await ctx.request.post(
          `${base}/api/materials/import?source=${encodeURIComponent('e2e invented values')}`,
          {
            data: TEAM_MATERIAL_CSV,
            headers: { Origin: base, 'Content-Type': 'text/csv' },
          },
        );
        expect(up.ok(), `materials import answered ${up.status()} ${await up.text()}`);
        await page.goto(`${base}/spools`);
        await page.getByRole('button', { name: '+ New spool' }).click();
        await page.getByTestId('sketcher').waitFor();
        await page.getByRole('button', { name: 'Draw leg East' }).click();
        await waitRows(page, 1);
        await page.getByRole('tab', { name: 'Design conditions' }).click();
        const picker = page.getByLabel('Material');
        await page.waitForFunction(
          () => [...document.querySelectorAll('option')].some((o) => o.value === 'E2E-CS1'),
          null,
          { timeout: STEP_TIMEOUT },
        );
        await picker.selectOption('E2E-CS1');
        await page.getByRole('button', { name: 'Apply conditions' }).click();
        await page.waitForFunction(
          () =>
            document
              .querySelector(
                '[data-testid="element-table"] tr[data-element-id="S1"] [data-check-status]',
              )
              ?.getAttribute('data-check-status') === 'pass',
          null,
          {
            timeout: STEP_TIMEOUT,
          },
        );
        await page.locator('[data-testid="element-table"] tr[data-element-id="S1"]').click();
        await page.getByText('Inputs and their sources').click();
        const inputs = (await page.getByTestId('inputs-table').textContent()) ?? '';
        expect(
          inputs.includes('E2E') || inputs.includes('e2e invented values'),
          `the check's inputs do not name the team material: ${inputs.slice(0, 300)}`,
        );
      });
    },
    MATERIAL_STEPS,
  );
  await page.close();
}

async function reviewJourney(ctx: BrowserContext, base: string, shared: E2EShared) {
  const page = await openPage(ctx);
  await journey(
    'checker and lead',
    async () => {
      await step(REVIEW_STEPS[0]!, async () => {
        expect(shared.spoolId, 'no spool from the designer journey');
        await signIn(page, base, 'checker@spoolwright.test');
        await page.goto(`${base}/spools/${shared.spoolId}`);
        await page.locator('[data-lifecycle="submitted"]').waitFor();
        await page.getByTestId('view-only').waitFor();
        expect(
          (await page.getByRole('button', { name: 'Return to designer' }).count()) === 1,
          'no "Return to designer" for the checker',
        );
        expect(
          (await page.getByRole('button', { name: 'Release for fabrication' }).count()) === 0,
          'a checker is offered "Release"',
        );
        await page.getByRole('button', { name: 'Mark checked' }).click();
        await page.locator('[data-lifecycle="checked"]').waitFor();
      });
      await step(REVIEW_STEPS[1]!, async () => {
        await page.getByRole('button', { name: 'Sign out' }).click();
        await page.waitForURL(/\/sign-in/);
        await signIn(page, base, 'lead@spoolwright.test');
        await page.goto(`${base}/spools/${shared.spoolId}`);
        const release = page.getByRole('button', { name: 'Release for fabrication' });
        await release.waitFor();
        expect(await release.isDisabled(), 'release is offered although B2 and B3 fail');
        expect(
          (await release.getAttribute('data-blocked')) === 'check',
          'release is disabled for another reason',
        );
        await page.getByRole('link', { name: 'Spool register' }).click();
        await page.getByLabel('Filter by state').selectOption('checked');
        await page
          .locator(`[data-spool-id="${shared.spoolId}"] [data-lifecycle="checked"]`)
          .waitFor();
      });
    },
    REVIEW_STEPS,
  );
  await page.close();
}

// ---------------------------------------------------------------------------------------------

const STEPS = [
  ...DESIGNER_STEPS,
  ...FABRICATOR_STEPS,
  ...MORE_STEPS,
  ...MATERIAL_STEPS,
  ...REVIEW_STEPS,
];

export const sketcherJourneys: E2EJourney = {
  name: 'sketcher',
  steps: STEPS,
  async run(browser, base, shared) {
    const designer = await newContext(browser);
    await designerJourney(designer, base, shared);
    await designer.close();
    const fabricator = await newContext(browser);
    await fabricatorJourney(fabricator, base, shared);
    await fabricator.close();
    const again = await newContext(browser, { acceptDownloads: true });
    await moreDesignerJourney(again, base, shared);
    await again.close();
    const materials = await newContext(browser);
    await teamMaterialJourney(materials, base);
    await materials.close();
    const review = await newContext(browser);
    await reviewJourney(review, base, shared);
    await review.close();
  },
};
