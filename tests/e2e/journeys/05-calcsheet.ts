/**
 * The calc sheet journey: a checker opens the calc sheet of the released demo spool from the
 * sketcher, reads it on screen, prints it (Chromium's own PDF of the print stylesheet) and
 * downloads the server's PDF; both PDFs' text is read back with poppler's pdftotext.
 */
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import type { BrowserContext } from 'playwright-core';
import { CAUTION } from '../../../shared/model/caution';
import {
  expect,
  journey,
  newContext,
  openPage,
  RESULTS,
  screenshot,
  signIn,
  step,
  type E2EJourney,
} from '../harness';

const SPOOL = 'CW-101-01 Cooling water header drop';
const STEPS = [
  'checker opens the released demo spool and follows "Calc sheet" from the spool bar',
  'the page shows every element with its trail, the revision history and the caution',
  'printing keeps the caution and "Page i of N" on every page, one element per page',
  'Download PDF gives the calc sheet: spool, element ids, equation trail and caution',
];

const fold = (s: string) => s.replace(/\s+/g, ' ');
const pdfText = (file: string) => fold(execFileSync('pdftotext', [file, '-']).toString('utf8'));
const pdfPages = (file: string) =>
  Number(/Pages:\s+(\d+)/.exec(execFileSync('pdfinfo', [file]).toString('utf8'))?.[1]);

async function runCalcSheetJourney(ctx: BrowserContext, base: string) {
  const page = await openPage(ctx);
  let elementIds: string[] = [];
  await journey(
    'calc sheet journey',
    async () => {
      await step(STEPS[0]!, async () => {
        await signIn(page, base, 'checker@spoolwright.test');
        await page.getByLabel('Find spools').fill('CW-101-01');
        await page.getByRole('link', { name: SPOOL }).click();
        await page.getByTestId('sketcher').waitFor();
        await page.getByRole('link', { name: 'Calc sheet' }).click();
        await page.waitForURL(/\/spools\/[^/]+\/calc-sheet/);
        await page.getByTestId('calc-sheet').waitFor();
      });
      await step(STEPS[1]!, async () => {
        const sheet = page.getByTestId('calc-sheet');
        const text = fold((await sheet.textContent()) ?? '');
        expect(
          text.includes(`${SPOOL} · rev. 0 · released`),
          'the sheet names the spool, revision and state',
        );
        elementIds = await page
          .locator('[data-testid="calc-sheet-element"]')
          .evaluateAll((els) => els.map((e) => e.getAttribute('data-element-id') ?? ''));
        expect(
          elementIds.length === 5 && elementIds.includes('CW-B1'),
          `elements shown: ${elementIds.join(', ')}`,
        );
        const steps = await page.getByTestId('calc-sheet-trail-step').count();
        expect(steps >= 5 * 4, `equation trail steps shown: ${steps}`);
        expect(
          text.includes('t = P·D / (2·(S·E·W + P·Y))'),
          'the straight-pipe trail (B31.3 Eq. 3a) is shown',
        );
        const history = fold((await page.getByTestId('calc-sheet-history').textContent()) ?? '');
        for (const move of ['submitted for check', 'checked', 'released for fabrication'])
          expect(history.includes(move), `history shows "${move}": ${history}`);
        expect(
          history.includes('Tobin Reyes') && history.includes('Jonah Pikeworth'),
          'history names the checker and the lead',
        );
        expect(
          fold((await page.getByTestId('caution').first().textContent()) ?? '').includes(CAUTION),
          'the caution is on the page',
        );
        await screenshot(page, 'calc-sheet-page');
      });
      await step(STEPS[2]!, async () => {
        const file = path.join(RESULTS, 'calc-sheet-print.pdf');
        fs.mkdirSync(RESULTS, { recursive: true });
        await page.emulateMedia({ media: 'print' });
        await page.pdf({ path: file, preferCSSPageSize: true, printBackground: true });
        await page.emulateMedia({ media: 'screen' });
        const pages = pdfPages(file);
        const text = pdfText(file);
        expect(
          pages > elementIds.length,
          `printed ${pages} pages for ${elementIds.length} elements`,
        );
        const cautions = text.split(CAUTION).length - 1;
        expect(cautions === pages, `caution printed ${cautions} times on ${pages} pages`);
        for (let i = 1; i <= pages; i++)
          expect(
            text.includes(`Page ${i} of ${pages}`),
            `printed page ${i} is numbered "Page ${i} of ${pages}"`,
          );
        expect(
          !text.includes('Download PDF') && !text.includes('Spool register'),
          'the toolbar and the app header are not printed',
        );
        // Each element starts its own page.
        for (let p = 1; p <= pages; p++) {
          const one = fold(
            execFileSync('pdftotext', ['-f', String(p), '-l', String(p), file, '-']).toString(
              'utf8',
            ),
          );
          const titles = elementIds.filter(
            (id) => one.includes(`Straight ${id} `) || one.includes(`Bend ${id} `),
          );
          expect(titles.length <= 1, `printed page ${p} starts ${titles.length} elements`);
        }
      });
      await step(STEPS[3]!, async () => {
        const [download] = await Promise.all([
          page.waitForEvent('download'),
          page.getByTestId('download-pdf').click(),
        ]);
        expect(
          download.suggestedFilename() ===
            'CW-101-01-Cooling-water-header-drop-rev0-calc-sheet.pdf',
          `file name ${download.suggestedFilename()}`,
        );
        const file = path.join(RESULTS, 'calc-sheet-download.pdf');
        await download.saveAs(file);
        expect(
          fs.readFileSync(file).subarray(0, 5).toString('latin1') === '%PDF-',
          'the download is a PDF',
        );
        const text = pdfText(file);
        const pages = pdfPages(file);
        expect(
          text.includes(`${SPOOL} · rev. 0 · released`),
          'the PDF names the spool, revision and state',
        );
        for (const id of elementIds) expect(text.includes(id), `the PDF has element ${id}`);
        for (const line of [
          't = P·D / (2·(S·E·W + P·Y))',
          'I = (4·(R1/D) − 1) / (4·(R1/D) − 2)',
          'tm = t + c',
          'T >= tm / (1 − tol)',
        ]) {
          expect(text.includes(line), `the PDF has the trail line "${line}"`);
        }
        expect(
          text.includes('released for fabrication Jonah Pikeworth'),
          'the PDF has the history',
        );
        expect(text.split(CAUTION).length - 1 === pages, 'the caution is on every PDF page');
        expect(
          text.includes(`Page 1 of ${pages}`) && text.includes(`Page ${pages} of ${pages}`),
          'the PDF pages are numbered',
        );
        // Pictures of the first two PDF pages, kept with the results.
        execFileSync('pdftoppm', [
          '-png',
          '-r',
          '70',
          '-f',
          '1',
          '-l',
          '2',
          file,
          path.join(RESULTS, 'calc-sheet-pdf-page'),
        ]);
      });
    },
    STEPS,
  );
}

export const calcSheetJourney: E2EJourney = {
  name: 'calc sheet',
  steps: STEPS,
  async run(browser, base) {
    const ctx = await newContext(browser, { acceptDownloads: true });
    await runCalcSheetJourney(ctx, base);
    await ctx.close();
  },
};
