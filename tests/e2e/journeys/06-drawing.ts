/**
 * Drawing journey: a designer draws a 45° offset and a rolled leg, reads the bend angles in
 * the element list, finds a tall spool whole after a reload (first fit at 1280 × 800),
 * focuses on a selected element, and edits an explicit OD and wall in metric display.
 */
import type { Page } from 'playwright-core';
import {
  expect,
  journey,
  newContext,
  openPage,
  projectElement,
  screenshot,
  signIn,
  step,
  STEP_TIMEOUT,
  type E2EJourney,
} from '../harness';

const STEPS = [
  'designer opens a new spool at 1280 × 800',
  'draws a 45° offset and a rolled leg and sees the bend angles in the element list',
  'a tall spool is whole in the first fit after a reload',
  'focuses on a selected element (button and Shift+F)',
  'edits an explicit OD and wall in metric display and reads the trail in mm',
];

interface ScreenBox {
  canvas: { left: number; top: number; width: number; height: number };
  min: { x: number; y: number };
  max: { x: number; y: number };
}

const screenBox = (page: Page) =>
  page.evaluate(() =>
    (
      window as unknown as { __spoolwright?: { spoolScreenBox(): ScreenBox } }
    ).__spoolwright!.spoolScreenBox(),
  );

const rowsIds = (page: Page) =>
  page
    .locator('[data-testid="element-table"] tbody tr')
    .evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-element-id')));

async function waitRows(page: Page, n: number): Promise<void> {
  await page.waitForFunction(
    (want) => document.querySelectorAll('[data-testid="element-table"] tbody tr').length === want,
    n,
    { timeout: STEP_TIMEOUT },
  );
}

/** The "Length / angle" cell of an element's row. */
async function sizeCell(page: Page, id: string): Promise<string> {
  const row = page.locator(`[data-testid="element-table"] tr[data-element-id="${id}"]`);
  const cells = await row.locator('td').allTextContents();
  return cells[5] ?? '';
}

async function framesSettle(page: Page): Promise<void> {
  await page.waitForFunction(
    () =>
      ((window as unknown as { __spoolwright?: { frames: number } }).__spoolwright?.frames ?? 0) >=
      1,
    null,
    {
      timeout: STEP_TIMEOUT,
    },
  );
  await page.waitForTimeout(400);
}

export const drawingJourney: E2EJourney = {
  name: 'drawing',
  steps: STEPS,
  async run(browser, base) {
    const ctx = await newContext(browser, { viewport: { width: 1280, height: 800 } });
    const page = await openPage(ctx);
    await journey(
      'drawing journey',
      async () => {
        await step(STEPS[0]!, async () => {
          await signIn(page, base, 'designer@spoolwright.test');
          await page.getByRole('button', { name: '+ New spool' }).click();
          await page.waitForURL(/\/spools\/[^/?]+$/);
          await page.getByTestId('sketcher').waitFor();
          const nameBox = page.getByLabel('Spool name');
          await nameBox.fill(`E2E offsets ${Date.now()}`);
          await nameBox.press('Enter');
        });

        await step(STEPS[1]!, async () => {
          await page.getByLabel('Leg length').fill('36');
          await page.getByRole('button', { name: 'Draw leg East' }).click();
          await page.getByRole('button', { name: 'Angled…' }).click();
          const group = page.getByRole('group', { name: 'Angled leg' });
          // default: 45° from east toward north
          const preview = await group.getByTestId('angled-preview').textContent();
          expect(preview?.startsWith('45° from east toward north'), `preview reads "${preview}"`);
          expect(preview?.includes("bend at the run's end 45°"), `preview reads "${preview}"`);
          await group.getByRole('button', { name: 'Draw angled leg' }).click();
          await page.getByRole('button', { name: 'Draw leg East' }).click();
          await waitRows(page, 5);
          // A rolled leg: from east, rolled up 30°.
          await page.getByLabel('Angled leg toward').selectOption('up');
          await page.getByLabel('Angled leg angle').fill('30');
          await group.getByRole('button', { name: 'Draw angled leg' }).click();
          await waitRows(page, 7);
          // A field-named refusal: toward cannot be the axis itself.
          await page.getByLabel('Angled leg toward').selectOption('east');
          const err = await page.getByTestId('angled-errors').textContent();
          expect(err?.includes('Toward must be perpendicular to east'), `error reads "${err}"`);
          await page.getByLabel('Angled leg toward').selectOption('up');
          const ids = await rowsIds(page);
          expect(
            JSON.stringify(ids) === JSON.stringify(['S1', 'B1', 'S2', 'B2', 'S3', 'B3', 'S4']),
            `elements are ${ids.join(',')}`,
          );
          const angles = [
            await sizeCell(page, 'B1'),
            await sizeCell(page, 'B2'),
            await sizeCell(page, 'B3'),
          ];
          expect(
            JSON.stringify(angles) === JSON.stringify(['45°', '45°', '30°']),
            `bend angles read ${angles.join(', ')}`,
          );
          // Cut length of the offset leg: 36 − 2 × R·tan 22.5° with R = 1.5 × 2 in (a new
          // spool's 1.5D bends, NPS 2) = 36 − 2.485 = 33.51 in.
          const s2 = await sizeCell(page, 'S2');
          expect(s2.startsWith('33.51'), `S2 reads "${s2}"`);
          await page.getByRole('button', { name: 'Fit' }).click();
          await framesSettle(page);
          // The bends are drawn where the path puts them: a click on B1 selects it.
          const pt = await projectElement(page, 'B1');
          expect(pt, 'B1 is on the canvas');
          await page.mouse.click(pt!.x, pt!.y);
          await page.locator('[data-testid="inspector"][data-element-id="B1"]').waitFor();
          await screenshot(page, 'drawing-offset-and-rolled-leg');
        });

        await step(STEPS[2]!, async () => {
          await page.keyboard.press('Escape');
          await page.getByLabel('Leg length').fill('720');
          await page.getByRole('button', { name: 'Draw leg Up' }).click();
          await waitRows(page, 9);
          await page.keyboard.press('Control+s');
          await page.getByRole('button', { name: 'Saved' }).waitFor();
          await page.reload();
          await page.getByTestId('sketcher').waitFor();
          await waitRows(page, 9);
          await framesSettle(page);
          const box = await screenBox(page);
          const c = box.canvas;
          const inside =
            box.min.x >= c.left - 0.5 &&
            box.max.x <= c.left + c.width + 0.5 &&
            box.min.y >= c.top - 0.5 &&
            box.max.y <= c.top + c.height + 0.5;
          expect(inside, `spool box ${JSON.stringify(box)} is not inside the canvas`);
          // and it uses the height: the tall riser fills most of it
          expect(
            box.max.y - box.min.y > 0.6 * c.height,
            `spool box height ${box.max.y - box.min.y} of ${c.height}`,
          );
          // the angled legs came back from the server
          const angles = [
            await sizeCell(page, 'B1'),
            await sizeCell(page, 'B2'),
            await sizeCell(page, 'B3'),
          ];
          expect(
            JSON.stringify(angles) === JSON.stringify(['45°', '45°', '30°']),
            `after reload: ${angles.join(', ')}`,
          );
          await screenshot(page, 'drawing-tall-spool-first-fit');
        });

        await step(STEPS[3]!, async () => {
          const before = await screenBox(page);
          await page.locator('[data-testid="element-table"] tr[data-element-id="B2"]').click();
          await page.locator('[data-testid="inspector"][data-element-id="B2"]').waitFor();
          await page.getByRole('button', { name: 'Focus' }).click();
          await page.waitForTimeout(400);
          const after = await screenBox(page);
          const grow = (after.max.y - after.min.y) / (before.max.y - before.min.y);
          expect(grow > 4, `focus zoomed the view ×${grow.toFixed(2)}`);
          const pt = await projectElement(page, 'B2');
          const c = after.canvas;
          expect(
            pt &&
              Math.abs(pt.x - (c.left + c.width / 2)) < c.width * 0.2 &&
              Math.abs(pt.y - (c.top + c.height / 2)) < c.height * 0.2,
            `B2 at ${JSON.stringify(pt)} is not near the canvas centre`,
          );
          await screenshot(page, 'drawing-focus-on-selected');
          // F fits the whole spool again; Shift+F focuses again.
          await page.locator('body').click({ position: { x: 3, y: 3 } });
          await page.locator('[data-testid="element-table"] tr[data-element-id="S3"]').click();
          await page.keyboard.press('f');
          await page.waitForTimeout(300);
          const fitted = await screenBox(page);
          expect(
            Math.abs(fitted.max.y - fitted.min.y - (before.max.y - before.min.y)) < 2,
            'F did not fit the spool again',
          );
          await page.keyboard.press('Shift+F');
          await page.waitForTimeout(300);
          const refocused = await screenBox(page);
          expect(
            refocused.max.y - refocused.min.y > 4 * (fitted.max.y - fitted.min.y),
            'Shift+F did not zoom to S3',
          );
          await page.getByRole('button', { name: 'Keys ?' }).click();
          await page
            .getByRole('dialog', { name: 'Sketcher keys' })
            .getByText('focus on the selected element')
            .waitFor();
          await page.getByRole('button', { name: 'Close key list' }).click();
        });

        await step(STEPS[4]!, async () => {
          await page.locator('[data-units="metric"]').click();
          await page.getByText('Leg length (mm)').waitFor();
          await page.locator('[data-testid="element-table"] tr[data-element-id="S1"]').click();
          await page.locator('[data-testid="inspector"][data-element-id="S1"]').waitFor();
          await page.getByLabel(/^Outside diameter D/).fill('60.3');
          await page.getByLabel(/^Nominal wall T/).fill('40');
          const err = await page
            .getByText('Nominal wall T must be less than half the outside diameter (30.15)')
            .textContent();
          expect(err, 'wall error shown');
          await page.getByLabel(/^Nominal wall T/).fill('5.54');
          await page.getByRole('button', { name: 'Apply', exact: true }).click();
          await page.waitForFunction(() => {
            const s = (
              window as unknown as {
                __spoolwright?: {
                  store: {
                    getState(): { doc: { elements: { id: string; nominalWall?: number }[] } };
                  };
                };
              }
            ).__spoolwright;
            const el = s?.store.getState().doc.elements.find((e) => e.id === 'S1');
            return el?.nominalWall !== undefined && Math.abs(el.nominalWall - 5.54 / 25.4) < 1e-9;
          });
          const stored = await page.evaluate(() => {
            const s = (
              window as unknown as {
                __spoolwright: {
                  store: {
                    getState(): {
                      doc: { units: string; elements: { id: string; outsideDiameter?: number }[] };
                    };
                  };
                };
              }
            ).__spoolwright;
            const doc = s.store.getState().doc;
            return {
              units: doc.units,
              od: doc.elements.find((e) => e.id === 'S1')?.outsideDiameter,
            };
          });
          // stored in the document's own units: 60.3 mm = 2.374016 in
          expect(
            stored.units === 'imperial' &&
              stored.od !== undefined &&
              Math.abs(stored.od - 60.3 / 25.4) < 1e-9,
            `stored ${JSON.stringify(stored)}`,
          );
          const note = await page.getByTestId('trail-units').textContent();
          expect(note?.includes('mm, MPa, °C'), `trail note reads "${note}"`);
          const steps = await page.getByTestId('trail-step').allTextContents();
          const eq = steps.find((s) => s.includes('Eq. (3a)')) ?? '';
          // t = P·D / …: D = 60.3 mm written in the substituted equation, the result in mm
          expect(eq.includes('× 60.3 /') && eq.trim().endsWith('mm'), `trail step reads "${eq}"`);
          const inputs = await page.getByTestId('inputs-table').textContent();
          expect(inputs?.includes('element nominalWall'), 'the check uses the explicit wall');
          await screenshot(page, 'drawing-explicit-wall-metric');
          await page.keyboard.press('Control+s');
          await page.getByRole('button', { name: 'Saved' }).waitFor();
        });
      },
      STEPS,
    );
    await page.close();
    await ctx.close();
  },
};
