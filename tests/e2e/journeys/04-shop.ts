/**
 * The shop journey: a fabricator opens the fabrication sheet of a released demo spool from the
 * register, reads it, prints it and downloads the CSVs, and reaches another spool's sheet from
 * the sketcher's spool bar.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { CAUTION } from '../../../shared/model/caution';
import {
  expect,
  journey,
  newContext,
  openPage,
  screenshot,
  signIn,
  step,
  type E2EJourney,
} from '../harness';

const STEPS = [
  'fabricator opens a released spool from the register and lands on its fabrication sheet',
  'the sheet lists bends, cuts, materials, masses and the hydrotest with the caution',
  'the cut list, bill of materials and element table download as CSV with units and revision',
  'the print view leaves out the app frame and the buttons',
  'the calc sheet PDF of the revision downloads from the sheet and reads back with pdftotext',
  'the sketcher links to the sheet; bends to be ordered heavier are flagged',
];

const RELEASED = 'CW-101-01 Cooling water header drop';
const HEAVIER = 'ST-415-01 Steam supply to reboiler';

async function downloadCsv(
  page: Page,
  button: string,
): Promise<{ name: string; rows: Record<string, string>[]; fields: string[] }> {
  const [download] = await Promise.all([
    page.waitForEvent('download'),
    page.getByRole('button', { name: button }).click(),
  ]);
  const file = await download.path();
  const text = fs.readFileSync(file, 'utf8');
  const parsed = Papa.parse<Record<string, string>>(text.trim(), { header: true });
  return {
    name: download.suggestedFilename(),
    rows: parsed.data,
    fields: parsed.meta.fields ?? [],
  };
}

export const shopJourney: E2EJourney = {
  name: 'shop',
  steps: STEPS,
  async run(browser, base) {
    const ctx = await newContext(browser, { acceptDownloads: true });
    const page = await openPage(ctx);
    await journey(
      'fabricator journey',
      async () => {
        await step(STEPS[0]!, async () => {
          await signIn(page, base, 'fabricator@spoolwright.test');
          await page.getByLabel('Find spools').fill('CW-101-01');
          // The search is debounced: wait for the filtered register before clicking.
          await page.getByText(/^1 spool$/).waitFor();
          const link = page.getByTestId('spool-table').getByRole('link', { name: RELEASED });
          await link.waitFor();
          const href = await link.getAttribute('href');
          expect(
            href?.endsWith('/fabrication'),
            `register link for a released spool goes to the sheet (got ${href})`,
          );
          await link.click();
          await page.waitForURL(/\/spools\/[^/]+\/fabrication$/);
          await page.getByTestId('fabrication-sheet').waitFor();
        });
        await step(STEPS[1]!, async () => {
          await page.getByRole('heading', { name: `Fabrication sheet · ${RELEASED}` }).waitFor();
          const bends = page.getByRole('table', { name: 'Bend list' });
          expect((await bends.locator('tbody tr').count()) === 2, 'two bends in the bend list');
          // Straights are cut as drawn: CW-S1 is 48 in (demo data).
          expect(
            (await page.getByTestId('cut-CW-S1').textContent()) === '48',
            'CW-S1 cut length 48 in',
          );
          expect(
            (await page.getByTestId('weld-count').textContent()) === '4',
            'four butt welds between five pieces',
          );
          const pt = await page.getByTestId('test-pressure').textContent();
          // 150 psi at 120 °F (A106 B, S = ST = 20.0 ksi, B31.3 Table A-1): PT = 1.5 × 150 = 225 psi (para. 345.4.2).
          expect(pt === '225 psi', `hydrotest 225 psi (got ${pt})`);
          expect(
            await page.getByTestId('hydrotest-caution').isVisible(),
            'hydrotest caution shown',
          );
          expect(
            await page.getByTestId('caution').first().isVisible(),
            'engineering caution shown',
          );
          const empty = Number(await page.getByTestId('mass-empty').textContent());
          const filled = Number(await page.getByTestId('mass-filled').textContent());
          expect(empty > 0 && filled > empty, `masses empty ${empty} < filled ${filled}`);
          await screenshot(page, 'fabrication-sheet');
        });
        await step(STEPS[2]!, async () => {
          const cut = await downloadCsv(page, 'Cut list CSV');
          expect(
            /^CW-101-01-Cooling-water-header-drop-rev\d+-cut-list\.csv$/.test(cut.name),
            `cut list file name ${cut.name}`,
          );
          expect(
            cut.fields.includes('cut length (in)') && cut.fields.includes('mass (lb)'),
            `cut list header ${cut.fields.join(',')}`,
          );
          expect(
            cut.rows.length === 5 &&
              cut.rows[0]!.element === 'CW-S1' &&
              cut.rows[0]!['cut length (in)'] === '48',
            'cut list rows',
          );
          const bend = cut.rows.find((r) => r.element === 'CW-B1')!;
          // 3D bend of NPS 4 (R = 12 in), 90°: arc R·θ = 6π in; tangent R·tan 45° = 12 in.
          expect(
            Math.abs(Number(bend['arc length (in)']) - 6 * Math.PI) < 1e-3,
            `arc length ${bend['arc length (in)']}`,
          );
          expect(Number(bend['bend tangent R·tan(θ/2) (in)']) === 12, 'bend tangent 12 in');
          const bom = await downloadCsv(page, 'Bill of materials CSV');
          expect(bom.name.endsWith('-bom.csv'), `bom file ${bom.name}`);
          expect(
            bom.rows.length >= 1 && bom.rows[0]!.NPS === '4' && bom.rows[0]!.material === 'A106-B',
            'bill of materials row NPS 4 A106-B',
          );
          expect(bom.fields.includes('length to order (in)'), 'bom units');
          const elements = await downloadCsv(page, 'Element table CSV');
          expect(elements.name.endsWith('-elements.csv'), `elements file ${elements.name}`);
          expect(
            elements.fields.includes('MAWP (psi)') && elements.rows.length === 5,
            'element table CSV',
          );
        });
        await step(STEPS[3]!, async () => {
          await page.emulateMedia({ media: 'print' });
          expect(!(await page.locator('header').first().isVisible()), 'app header hidden in print');
          expect(
            !(await page.getByRole('button', { name: 'Print' }).isVisible()),
            'buttons hidden in print',
          );
          await screenshot(page, 'fabrication-sheet-print');
          await page.emulateMedia({ media: 'screen' });
        });
        await step(STEPS[4]!, async () => {
          const [download] = await Promise.all([
            page.waitForEvent('download'),
            page.getByTestId('calc-sheet-pdf').click(),
          ]);
          expect(
            /^CW-101-01-Cooling-water-header-drop-rev\d+-calc-sheet\.pdf$/.test(
              download.suggestedFilename(),
            ),
            `PDF file name ${download.suggestedFilename()}`,
          );
          const file = await download.path();
          expect(
            fs.readFileSync(file).subarray(0, 5).toString('latin1') === '%PDF-',
            'the download is a PDF',
          );
          const text = execFileSync('pdftotext', [file, '-']).toString('utf8').replace(/\s+/g, ' ');
          expect(text.includes(RELEASED), 'the PDF names the spool');
          for (const id of ['CW-S1', 'CW-B1', 'CW-S3'])
            expect(text.includes(id), `the PDF has element ${id}`);
          expect(text.includes(CAUTION), 'the PDF carries the caution');
        });
        await step(STEPS[5]!, async () => {
          await page.goto(`${base}/spools`);
          await page.getByLabel('Find spools').fill('ST-415-01');
          await page.getByText(/^1 spool$/).waitFor();
          const link = page.getByRole('link', { name: HEAVIER });
          await link.waitFor();
          await link.click();
          await page.getByTestId('sketcher').waitFor();
          await page.getByRole('link', { name: 'Fabrication sheet' }).click();
          await page.waitForURL(/\/fabrication$/);
          await page.getByTestId('order-heavier-ST-B1').waitFor();
          const status = await page.getByRole('status').first().textContent();
          expect(status?.includes('not released'), 'unreleased revision is marked');
          await screenshot(page, 'fabrication-sheet-order-heavier');
        });
      },
      STEPS,
    );
    await ctx.close();
  },
};
