/**
 * The review journey: submit, comment on a bend, return, fix, resolve, resubmit, check, release,
 * share read-only with someone without an account, revoke; history and an older revision; the
 * mail of every transition.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import {
  expect,
  journey,
  newContext,
  openPage,
  PASSWORD,
  projectElement,
  screenshot,
  signIn,
  statusOf,
  step,
  STEP_TIMEOUT,
  type E2EJourney,
} from '../harness';
import { seriousViolations } from './09-a11y';

const STEPS = [
  'designer submits a spool with a failing bend',
  'checker finds it waiting and pins two comments on the bend',
  'the comment badge follows the bend when the view moves; badge and list marker open the thread',
  '"Mark checked" is refused while comments are open, naming them',
  'checker returns it with a note asked for in the page',
  'designer sees it waiting with its open comments',
  'designer fixes the bend, resolves the threads and resubmits',
  'checker marks it checked',
  'lead releases it and creates a share link',
  'the link opens read-only in a fresh browser with no account',
  'lead revokes the link and the page says it is revoked',
  'history lists the events; an older revision opens read-only; two revisions compare',
  'each transition mailed the next role with a link to the spool',
] as const;

/** Invented demo spool: NPS 2 at 1100 psi, the Sch 40 bend fails at its intrados, the Sch 80 straights pass. */
function reviewDocument(name: string) {
  return {
    units: 'imperial',
    name,
    line: '2"-RV-0902-A1',
    conditions: {
      pressure: 1100,
      temperature: 100,
      material: 'A106-B',
      corrosionAllowance: 0.0625,
      millTolerance: 0.125,
    },
    elements: [
      { kind: 'straight', id: 'S1', nps: '2', schedule: '80', direction: 'east', length: 36 },
      {
        kind: 'bend',
        id: 'B1',
        nps: '2',
        schedule: '40',
        direction: 'north',
        bendRadius: { multipleOfD: 1.5 },
        angle: 90,
      },
      { kind: 'straight', id: 'S2', nps: '2', schedule: '80', direction: 'north', length: 36 },
    ],
  };
}

async function signedIn(
  browser: Browser,
  base: string,
  email: string,
): Promise<{ ctx: BrowserContext; page: Page }> {
  // bypassCSP lets axe's script be injected once the server sends a Content-Security-Policy.
  const ctx = await newContext(browser, { bypassCSP: true });
  const page = await openPage(ctx);
  await signIn(page, base, email);
  return { ctx, page };
}

async function openSpool(page: Page, base: string, id: string, query = '') {
  await page.goto(`${base}/spools/${id}${query}`);
  await page.getByTestId('sketcher').waitFor();
  await page.locator('[data-testid="element-table"] tr[data-element-id="B1"]').waitFor();
}

async function clickElementOnCanvas(page: Page, id: string) {
  if ((await page.locator('canvas').count()) > 0) {
    await page.getByRole('button', { name: 'Fit' }).click();
    await page.waitForTimeout(400);
    const pt = await projectElement(page, id);
    if (pt) {
      await page.mouse.click(pt.x, pt.y);
      await page
        .locator(`[data-testid="element-table"] tr[data-element-id="${id}"][aria-selected="true"]`)
        .waitFor();
      return;
    }
  }
  await page.locator(`[data-testid="element-table"] tr[data-element-id="${id}"]`).click();
}

async function waitingCount(page: Page): Promise<number> {
  const text = (await page.getByTestId('waiting-count').textContent()) ?? '';
  return Number(/(\d+)\s*$/.exec(text.trim())?.[1] ?? NaN);
}

export const reviewJourney: E2EJourney = {
  name: 'review',
  steps: STEPS,
  async run(browser, base) {
    const name = `E2E review ${Date.now()}`;
    let spoolId = '';
    let shareUrl = '';
    const contexts: BrowserContext[] = [];
    const track = <T extends { ctx: BrowserContext }>(x: T) => {
      contexts.push(x.ctx);
      return x;
    };
    await journey(
      'review and sharing',
      async () => {
        await step(STEPS[0], async () => {
          const { page } = track(await signedIn(browser, base, 'designer@spoolwright.test'));
          const made = await page.request.post(`${base}/api/spools`, {
            data: { document: reviewDocument(name) },
            headers: { Origin: base },
          });
          expect(made.ok(), `create answered ${made.status()} ${await made.text()}`);
          spoolId = ((await made.json()) as { id: string }).id;
          await openSpool(page, base, spoolId);
          expect((await statusOf(page, 'B1')) === 'fail', `B1 is ${await statusOf(page, 'B1')}`);
          await page.getByRole('button', { name: 'Submit for check' }).click();
          await page.locator('[data-lifecycle="submitted"]').waitFor();
          await page.close();
        });

        const checker = track(await signedIn(browser, base, 'checker@spoolwright.test'));
        await step(STEPS[1], async () => {
          const page = checker.page;
          await page.locator(`[data-waiting-spool="${spoolId}"]`).waitFor();
          expect((await waitingCount(page)) >= 1, `header count reads ${await waitingCount(page)}`);
          await screenshot(page, 'review-register-waiting-checker');
          await page.locator(`[data-waiting-spool="${spoolId}"] a`).first().click();
          await page.getByTestId('sketcher').waitFor();
          await page.locator('[data-testid="element-table"] tr[data-element-id="B1"]').waitFor();
          await clickElementOnCanvas(page, 'B1');
          await page.getByRole('tab', { name: /^Review/ }).click();
          const panel = page.getByTestId('review-panel');
          await panel.waitFor();
          expect(
            (await page.getByLabel('Pin to').inputValue()) === 'B1',
            'the new comment is not pinned to the selected bend',
          );
          for (const text of [
            'Intrados wall short at 1100 psi: order Sch 80 bend pipe',
            'Confirm the 1.5D radius with the bending shop',
          ]) {
            await page.getByLabel(/New comment on revision/).fill(text);
            await page.getByRole('button', { name: 'Add comment' }).click();
            await page.locator('[data-testid="comment"]', { hasText: text }).waitFor();
            await page.waitForFunction(
              () =>
                (document.getElementById('new-comment-body') as HTMLTextAreaElement | null)
                  ?.value === '',
              null,
              { timeout: STEP_TIMEOUT },
            );
          }
          await page.getByRole('tab', { name: 'Review (2)' }).waitFor();
          await page.getByTestId('comment-badge-B1').waitFor();
          const marker = (await page.getByTestId('comment-marker-B1').textContent()) ?? '';
          expect(marker.includes('2'), `list marker reads "${marker}"`);
          await screenshot(page, 'review-panel');
        });

        await step(STEPS[2], async () => {
          const page = checker.page;
          const badge = page.getByTestId('comment-badge-B1');
          await page.waitForTimeout(300);
          const before = await badge.boundingBox();
          const canvas = page.locator('canvas');
          const box = await canvas.boundingBox();
          expect(before && box, 'badge or canvas has no box');
          // orbit the view: drag across an empty part of the canvas
          await page.mouse.move(box!.x + 40, box!.y + box!.height - 40);
          await page.mouse.down();
          await page.mouse.move(box!.x + 200, box!.y + box!.height - 120, { steps: 8 });
          await page.mouse.up();
          await page.waitForTimeout(500);
          const after = await badge.boundingBox();
          const pt = await projectElement(page, 'B1');
          expect(after && pt, 'no badge box or projection after the move');
          const moved = Math.hypot(after!.x - before!.x, after!.y - before!.y);
          expect(moved > 5, `the badge stayed put (${moved.toFixed(1)} px) while the view moved`);
          // the badge sits 6 px right of and 26 px above the bend's centre (the hook's point may lie a little along the arc)
          const off = Math.hypot(after!.x - (pt!.x + 6), after!.y - (pt!.y - 26));
          expect(
            off < 15,
            `badge at ${after!.x},${after!.y}; bend at ${pt!.x},${pt!.y} (${off.toFixed(1)} px off)`,
          );
          // badge: selects the element and opens its thread
          await page.locator('[data-testid="element-table"] tr[data-element-id="S1"]').click();
          await page.getByRole('tab', { name: 'Selected element' }).click();
          await badge.click();
          await page
            .locator('[data-testid="element-table"] tr[data-element-id="B1"][aria-selected="true"]')
            .waitFor();
          await page.locator('[data-thread="B1"]').waitFor();
          // list marker: the same
          await page.getByRole('tab', { name: 'Selected element' }).click();
          await page.getByTestId('comment-marker-B1').click();
          await page.locator('[data-thread="B1"]').waitFor();
          expect(
            (await page.getByRole('tab', { name: /^Review/ }).getAttribute('aria-selected')) ===
              'true',
            'the review tab is not open',
          );
        });

        await step(STEPS[3], async () => {
          const page = checker.page;
          await page.getByRole('button', { name: 'Mark checked' }).click();
          const alert = page.getByRole('alert').filter({ hasText: 'still open' });
          await alert.waitFor();
          const text = (await alert.textContent()) ?? '';
          expect(
            text.includes('B1') && text.includes('Intrados wall short'),
            `refusal reads "${text}"`,
          );
          expect(
            (await page.locator('[data-lifecycle="submitted"]').count()) === 1,
            'the spool left "submitted"',
          );
          await screenshot(page, 'review-mark-checked-refused');
        });

        await step(STEPS[4], async () => {
          const page = checker.page;
          let prompted = false;
          page.on('dialog', (d) => {
            prompted = true;
            void d.dismiss();
          });
          await page.getByRole('button', { name: 'Return to designer' }).click();
          const form = page.getByRole('dialog', { name: 'Return to designer' });
          await form.waitFor();
          await form.getByRole('button', { name: 'Return with this note' }).click();
          await form.getByRole('alert').filter({ hasText: 'Note' }).waitFor();
          await form
            .getByLabel(/Why is it returned/)
            .fill('B1 fails at the intrados; see the two comments on it.');
          await screenshot(page, 'review-return-note');
          await form.getByRole('button', { name: 'Return with this note' }).click();
          await page.locator('[data-lifecycle="draft"]').waitFor();
          expect(!prompted, 'a browser prompt was shown');
          await page
            .locator('[data-testid="comment"]', { hasText: 'see the two comments' })
            .waitFor();
        });

        const designer = track(await signedIn(browser, base, 'designer@spoolwright.test'));
        await step(STEPS[5], async () => {
          const page = designer.page;
          const row = page.locator(`[data-waiting-spool="${spoolId}"]`);
          await row.waitFor();
          const text = (await row.textContent()) ?? '';
          expect(text.includes('3 open comments'), `waiting row reads "${text}"`);
          expect(
            text.includes('Intrados wall short') && text.includes('see the two comments'),
            `waiting row lacks the comments: "${text}"`,
          );
          expect((await waitingCount(page)) >= 1, 'header count is 0');
          await screenshot(page, 'review-register-waiting-designer');
          // the comment's link opens the spool with the bend selected and its thread beside it
          await row.getByRole('link', { name: 'B1' }).first().click();
          await page.getByTestId('review-panel').waitFor();
          await page
            .locator('[data-testid="element-table"] tr[data-element-id="B1"][aria-selected="true"]')
            .waitFor();
        });

        await step(STEPS[6], async () => {
          const page = designer.page;
          await page.getByRole('tab', { name: 'Selected element' }).click();
          await page.locator('[data-testid="inspector"][data-element-id="B1"]').waitFor();
          const lightest = (await page.getByTestId('lightest-schedule').textContent())?.trim();
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
          await page.getByRole('button', { name: 'Save', exact: true }).click();
          await page.getByRole('button', { name: 'Saved', exact: true }).waitFor();
          await page.getByRole('tab', { name: /^Review/ }).click();
          for (let i = 0; i < 3; i++) {
            const open = page.locator('[data-testid="comment"][data-resolved="false"]');
            const n = await open.count();
            expect(n === 3 - i, `${n} open comments before resolving #${i + 1}`);
            await open.first().getByRole('button', { name: 'Resolve' }).click();
            await page.waitForFunction(
              (want) =>
                document.querySelectorAll('[data-testid="comment"][data-resolved="false"]')
                  .length === want,
              2 - i,
              { timeout: STEP_TIMEOUT },
            );
          }
          expect(
            (await page.getByTestId('comment-badge-B1').count()) === 0,
            'the badge stayed after resolving',
          );
          await page.getByRole('radio', { name: 'resolved' }).click();
          await page.waitForFunction(
            () =>
              document.querySelectorAll('[data-testid="comment"][data-resolved="true"]').length ===
              3,
            null,
            { timeout: STEP_TIMEOUT },
          );
          await page.getByRole('button', { name: 'Submit for check' }).click();
          await page.locator('[data-lifecycle="submitted"]').waitFor();
        });

        await step(STEPS[7], async () => {
          const page = checker.page;
          await openSpool(page, base, spoolId);
          await page.getByRole('button', { name: 'Mark checked' }).click();
          await page.locator('[data-lifecycle="checked"]').waitFor();
        });

        const lead = track(await signedIn(browser, base, 'lead@spoolwright.test'));
        await step(STEPS[8], async () => {
          const page = lead.page;
          await page.locator(`[data-waiting-spool="${spoolId}"]`).waitFor();
          await openSpool(page, base, spoolId);
          await page.getByRole('button', { name: 'Release for fabrication' }).click();
          await page.locator('[data-lifecycle="released"]').waitFor();
          await page.getByRole('button', { name: 'Share…' }).click();
          const dialog = page.getByRole('dialog', { name: 'Share spool' });
          await dialog.waitFor();
          await dialog.getByLabel('Expires in (days)').fill('0');
          await dialog.getByRole('button', { name: 'Create link' }).click();
          await dialog.getByRole('alert').filter({ hasText: 'Expires in (days)' }).waitFor();
          await dialog.getByLabel('Expires in (days)').fill('7');
          await dialog.getByRole('button', { name: 'Create link' }).click();
          const link = dialog.getByLabel('Share link', { exact: true });
          await link.waitFor();
          shareUrl = await link.inputValue();
          expect(shareUrl.startsWith(`${base}/share/`), `share link is ${shareUrl}`);
          await dialog
            .locator('[data-testid="share-list"] tr[data-state="active"]')
            .first()
            .waitFor();
          await screenshot(page, 'share-dialog');
          const axe = await seriousViolations(page);
          expect(axe.length === 0, `axe with the share dialog open:\n${axe.join('\n')}`);
        });

        const visitorCtx = await newContext(browser, { bypassCSP: true });
        contexts.push(visitorCtx);
        const visitor = await openPage(visitorCtx);
        await step(STEPS[9], async () => {
          expect((await visitorCtx.cookies()).length === 0, 'the fresh context has cookies');
          const apiCalls: string[] = [];
          visitor.on('request', (r) => {
            const u = new URL(r.url());
            if (u.pathname.startsWith('/api/')) apiCalls.push(u.pathname);
          });
          await visitor.goto(shareUrl);
          await visitor.getByTestId('share-banner').waitFor();
          expect(!visitor.url().includes('/sign-in'), `went to ${visitor.url()}`);
          const banner = (await visitor.getByTestId('share-banner').textContent()) ?? '';
          for (const want of [
            name,
            '2"-RV-0902-A1',
            'revision 0',
            'Released',
            'Shared by',
            'until',
          ]) {
            expect(banner.includes(want), `banner lacks "${want}": ${banner}`);
          }
          const pdf = visitor.getByRole('link', { name: 'Download calc sheet (PDF)' });
          expect(
            (await pdf.getAttribute('href'))?.endsWith('/calc-sheet.pdf'),
            'no calc sheet link',
          );
          await visitor.locator('[data-testid="element-table"] tr[data-element-id="B1"]').click();
          await visitor.locator('[data-testid="inspector"][data-element-id="B1"]').waitFor();
          expect(
            (await statusOf(visitor, 'B1')) === 'pass',
            `shared B1 is ${await statusOf(visitor, 'B1')}`,
          );
          expect((await visitor.getByTestId('trail-step').count()) > 0, 'no equation trail');
          expect((await visitor.getByTestId('caution').count()) > 0, 'no caution');
          for (const label of [
            /^Save/,
            /^Draw leg/,
            /^Use schedule/,
            /^Submit/,
            /^Share/,
            /^Apply/,
            /^Import/,
          ]) {
            expect(
              (await visitor.getByRole('button', { name: label }).count()) === 0,
              `an editing control ${String(label)} is shown`,
            );
          }
          expect(
            await visitor.getByLabel('Schedule').isDisabled(),
            'the schedule picker is editable',
          );
          expect(
            (await visitor.getByRole('link', { name: 'Spool register' }).count()) === 0,
            'team navigation is shown',
          );
          const foreign = apiCalls.filter((p) => !p.startsWith('/api/share/'));
          expect(foreign.length === 0, `the public page called ${foreign.join(', ')}`);
          await screenshot(visitor, 'share-public-page');
          const axe = await seriousViolations(visitor);
          expect(axe.length === 0, `axe on the public page:\n${axe.join('\n')}`);
        });

        await step(STEPS[10], async () => {
          const page = lead.page;
          const dialog = page.getByRole('dialog', { name: 'Share spool' });
          await dialog
            .locator('[data-testid="share-list"] tr[data-state="active"]')
            .first()
            .getByRole('button', { name: 'Revoke' })
            .click();
          await dialog
            .locator('[data-testid="share-list"] tr[data-state="revoked"]')
            .first()
            .waitFor();
          await screenshot(page, 'share-dialog-revoked');
          await dialog.getByRole('button', { name: 'Close' }).click();
          await visitor.reload();
          await visitor.getByTestId('share-revoked').waitFor();
          const text = (await visitor.getByTestId('share-revoked').textContent()) ?? '';
          expect(text.includes('revoked'), `page reads "${text}"`);
          expect(!visitor.url().includes('/sign-in'), 'a revoked link led to sign-in');
          expect(
            (await visitor.getByTestId('element-table').count()) === 0,
            'the revoked page still shows the spool',
          );
          await screenshot(visitor, 'share-revoked');
          const axe = await seriousViolations(visitor);
          expect(axe.length === 0, `axe on the revoked page:\n${axe.join('\n')}`);
        });

        await step(STEPS[11], async () => {
          const page = lead.page;
          // editing the released spool opens revision 1 in draft
          const cur = (await (await page.request.get(`${base}/api/spools/${spoolId}`)).json()) as {
            version: number;
            document: { elements: { id: string; length?: number }[] };
          };
          const doc = {
            ...cur.document,
            elements: cur.document.elements.map((e) => (e.id === 'S2' ? { ...e, length: 40 } : e)),
          };
          const put = await page.request.put(`${base}/api/spools/${spoolId}`, {
            data: { document: doc, baseVersion: cur.version },
            headers: { Origin: base },
          });
          expect(put.ok(), `edit answered ${put.status()}`);
          expect(((await put.json()) as { revision: number }).revision === 1, 'no new revision');
          await openSpool(page, base, spoolId);
          await page.getByRole('tab', { name: 'History' }).click();
          const history = page.getByTestId('history-panel');
          await history.waitFor();
          await page.waitForFunction(
            () => document.querySelectorAll('[data-testid="event"]').length >= 6,
            null,
            { timeout: STEP_TIMEOUT },
          );
          const moves = await page.getByTestId('event-move').allTextContents();
          for (const m of [
            'draft → submitted',
            'submitted → draft',
            'submitted → checked',
            'checked → released',
          ]) {
            expect(
              moves.some((x) => x.includes(m)),
              `events lack "${m}": ${moves.join(' | ')}`,
            );
          }
          expect(
            ((await history.textContent()) ?? '').includes('see the two comments'),
            'the return note is not in the history',
          );
          await page.locator('[data-change="S2.length"]').waitFor();
          const change = (await page.locator('[data-change="S2.length"]').textContent()) ?? '';
          expect(change.includes('36 → 40'), `comparison reads "${change}"`);
          await screenshot(page, 'review-history');
          await history
            .locator('li[data-revision="0"]')
            .getByRole('link', { name: 'Open read-only' })
            .click();
          const banner = page.getByTestId('revision-banner');
          await banner.waitFor();
          expect((await banner.getAttribute('data-revision')) === '0', 'wrong revision opened');
          await page.locator('[data-testid="element-table"] tr[data-element-id="S2"]').click();
          await page.locator('[data-testid="inspector"][data-element-id="S2"]').waitFor();
          expect(
            (await page.getByLabel('Length (in)', { exact: true }).inputValue()) === '36',
            `rev. 0 S2 length reads ${await page.getByLabel('Length (in)', { exact: true }).inputValue()}`,
          );
          expect(
            (await page.getByRole('button', { name: /^Save|^Draw leg|^Use schedule/ }).count()) ===
              0,
            'editing controls on a read-only revision',
          );
          expect(
            await page.getByLabel('Length (in)', { exact: true }).isDisabled(),
            'length is editable on a read-only revision',
          );
          await screenshot(page, 'review-revision-read-only');
          await banner.getByRole('link', { name: /Back to the current revision/ }).click();
          await page.getByTestId('sketcher').waitFor();
        });

        await step(STEPS[12], async () => {
          const adminCtx = await newContext(browser);
          contexts.push(adminCtx);
          const signin = await adminCtx.request.post(`${base}/api/auth/sign-in/email`, {
            data: { email: 'admin@spoolwright.test', password: PASSWORD },
            headers: { Origin: base },
          });
          expect(signin.ok(), `admin sign-in answered ${signin.status()}`);
          const r = await adminCtx.request.get(`${base}/api/admin/outbox?limit=200`);
          expect(r.ok(), `outbox answered ${r.status()}`);
          const { items } = (await r.json()) as {
            items: { to: string; subject: string; text: string }[];
          };
          const mine = items.filter((m) => m.subject.includes(name));
          const want: [string, string][] = [
            [`Spool ${name} submitted`, 'checker@spoolwright.test'],
            [`Spool ${name} returned to draft`, 'designer@spoolwright.test'],
            [`Spool ${name} checked`, 'lead@spoolwright.test'],
            [`Spool ${name} released`, 'fabricator@spoolwright.test'],
          ];
          for (const [subject, to] of want) {
            const m = mine.find((x) => x.subject === subject && x.to.includes(to));
            expect(
              m,
              `no mail "${subject}" to ${to}; have: ${mine.map((x) => `${x.subject} → ${x.to}`).join(' | ')}`,
            );
            expect(
              m.text.includes(`${base}/spools/${spoolId}`),
              `mail "${subject}" lacks the spool link: ${m.text}`,
            );
          }
          expect(
            mine.filter((x) => x.subject === `Spool ${name} submitted`).length === 2,
            'the resubmission was not mailed',
          );
        });
      },
      [...STEPS],
    );
    for (const c of contexts) await c.close();
  },
};
