/**
 * Accessibility: axe-core on every page as each role (0 serious or critical violations), and a
 * keyboard-only pass through sign-in, the register and drawing a spool.
 */
import { createRequire } from 'node:module';
import type { Browser, Page } from 'playwright-core';
import {
  expect,
  journey,
  newContext,
  openPage,
  PASSWORD,
  step,
  STEP_TIMEOUT,
  type E2EJourney,
} from '../harness';

const require = createRequire(import.meta.url);
const AXE_PATH = require.resolve('axe-core/axe.min.js');

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

/** Run axe on the page as it stands; returns the serious and critical violations, described. */
export async function seriousViolations(page: Page): Promise<string[]> {
  await page.addScriptTag({ path: AXE_PATH });
  const violations = await page.evaluate(async () => {
    const axe = (
      window as unknown as {
        axe: { run: (ctx: Document, opts: object) => Promise<{ violations: AxeViolation[] }> };
      }
    ).axe;
    const r = await axe.run(document, { resultTypes: ['violations'] });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.slice(0, 3).map((n) => ({ target: n.target })),
    }));
  });
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map(
      (v) =>
        `${v.impact} ${v.id} (${v.help}) at ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`,
    );
}

/** Press Tab until the focused element matches, at most `max` times. */
async function tabTo(
  page: Page,
  matches: (el: { label: string; tag: string; type: string }) => boolean,
  max = 60,
): Promise<void> {
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    const el = await page.evaluate(() => {
      const a = document.activeElement as HTMLElement | null;
      if (!a) return { label: '', tag: '', type: '' };
      const id = a.getAttribute('id');
      const byFor = id
        ? document.querySelector(`label[for="${CSS.escape(id)}"]`)?.textContent
        : null;
      const wrapping = a.closest('label')?.textContent;
      const label = (
        a.getAttribute('aria-label') ??
        byFor ??
        wrapping ??
        a.textContent ??
        ''
      ).trim();
      return { label, tag: a.tagName.toLowerCase(), type: a.getAttribute('type') ?? '' };
    });
    if (matches(el)) return;
  }
  throw new Error(`Tab never reached the wanted control in ${max} presses`);
}

async function signInByForm(page: Page, base: string, email: string): Promise<void> {
  await page.goto(`${base}/sign-in`);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/spools(\?|$)/);
  await page.getByRole('heading', { name: 'Spool register' }).waitFor();
}

/** Pages each role can open, as paths with `:spool` standing for a demo spool's id. */
export const ROLE_PAGES: Record<string, readonly string[]> = {
  designer: [
    '/spools',
    '/spools/:spool',
    '/spools/:spool?panel=history',
    '/spools/:spool/revisions/0',
    '/spools/:spool/fabrication',
    '/line-list',
  ],
  checker: [
    '/spools',
    '/spools/:spool',
    '/spools/:spool/calc-sheet',
    '/spools/:spool?panel=review',
    '/spools/:spool/fabrication',
  ],
  fabricator: ['/spools', '/spools/:spool', '/spools/:spool/fabrication'],
  lead: [
    '/spools',
    '/spools/:spool',
    '/spools/:spool?panel=review',
    '/spools/:spool/fabrication',
    '/line-list',
  ],
  admin: [
    '/spools',
    '/spools/:spool',
    '/spools/:spool/fabrication',
    '/team',
    '/materials',
    '/line-list',
    '/outbox',
  ],
};

const STEPS = [
  'keyboard only: signs in',
  'keyboard only: searches the register and opens a new spool',
  'keyboard only: draws two legs and saves',
  'axe: the sign-in page has no serious or critical violation',
  ...Object.keys(ROLE_PAGES).map(
    (role) => `axe: every page as ${role} has no serious or critical violation`,
  ),
];

async function firstSpoolId(page: Page, base: string): Promise<string> {
  const res = await page.request.get(`${base}/api/spools?pageSize=5&sort=name`);
  const body = (await res.json()) as { items: { id: string }[] };
  const id = body.items[0]?.id;
  expect(id, 'the demo team has no spool');
  return id;
}

async function scanPages(
  browser: Browser,
  base: string,
  role: string,
  paths: readonly string[],
): Promise<void> {
  const ctx = await newContext(browser, { bypassCSP: true });
  const page = await openPage(ctx);
  try {
    await signInByForm(page, base, `${role}@spoolwright.test`);
    const spool = await firstSpoolId(page, base);
    const problems: string[] = [];
    for (const p of paths) {
      await page.goto(`${base}${p.replace(':spool', spool)}`);
      await page.waitForLoadState('networkidle', { timeout: STEP_TIMEOUT }).catch(() => undefined);
      // Let lazy chunks and queries settle (a loading line is not the page under test).
      await page
        .waitForFunction(
          () => !document.querySelector('[aria-busy="true"], [role="progressbar"]'),
          null,
          { timeout: STEP_TIMEOUT },
        )
        .catch(() => undefined);
      await page.waitForTimeout(300);
      for (const v of await seriousViolations(page)) problems.push(`${p}: ${v}`);
    }
    expect(problems.length === 0, `axe found:\n${problems.join('\n')}`);
  } finally {
    await ctx.close();
  }
}

export const accessibilityJourney: E2EJourney = {
  name: 'accessibility',
  steps: STEPS,
  async run(browser, base) {
    const ctx = await newContext(browser, { bypassCSP: true });
    const page = await openPage(ctx);
    await journey(
      'keyboard only and axe',
      async () => {
        await step(STEPS[0]!, async () => {
          await page.goto(`${base}/sign-in`);
          await page.getByLabel('Email').waitFor();
          await tabTo(page, (el) => el.type === 'email');
          await page.keyboard.type('designer@spoolwright.test');
          await tabTo(page, (el) => el.type === 'password', 3);
          await page.keyboard.type(PASSWORD);
          await page.keyboard.press('Enter');
          await page.waitForURL(/\/spools(\?|$)/);
          await page.getByRole('heading', { name: 'Spool register' }).waitFor();
        });
        await step(STEPS[1]!, async () => {
          await tabTo(page, (el) => el.label.includes('Find spools'));
          await page.keyboard.type('Larkspur');
          await tabTo(page, (el) => el.tag === 'button' && el.label.includes('New spool'));
          await page.keyboard.press('Enter');
          await page.waitForURL(/\/spools\/[^/?]+$/);
          await page.getByTestId('sketcher').waitFor();
        });
        await step(STEPS[2]!, async () => {
          await tabTo(page, (el) => el.label.includes('Spool name'), 80);
          await page.keyboard.type(`Keyboard spool ${Date.now()}`);
          await tabTo(page, (el) => el.label.includes('Leg length'), 80);
          await page.keyboard.press('Control+a');
          await page.keyboard.type('30');
          await tabTo(page, (el) => el.tag === 'button' && el.label.includes('Draw leg East'), 120);
          await page.keyboard.press('Enter');
          await tabTo(
            page,
            (el) => el.tag === 'button' && el.label.includes('Draw leg North'),
            120,
          );
          await page.keyboard.press('Enter');
          await page.waitForFunction(
            () => document.querySelectorAll('[data-testid="element-table"] tbody tr').length === 3,
            null,
            {
              timeout: STEP_TIMEOUT,
            },
          );
          await page.keyboard.press('Control+s');
          await page.getByText(/Saved/).first().waitFor();
        });
      },
      STEPS.slice(0, 3),
    );
    await ctx.close();
    // Each scan is its own journey, so one page's findings do not hide another's.
    await journey(
      'axe: sign-in',
      () =>
        step(STEPS[3]!, async () => {
          const anon = await newContext(browser, { bypassCSP: true });
          const p = await anon.newPage();
          await p.goto(`${base}/sign-in`);
          await p.getByLabel('Email').waitFor();
          const v = await seriousViolations(p);
          await anon.close();
          expect(v.length === 0, `axe found on /sign-in:\n${v.join('\n')}`);
        }),
      [STEPS[3]!],
    );
    for (const [role, paths] of Object.entries(ROLE_PAGES)) {
      const name = `axe: every page as ${role} has no serious or critical violation`;
      await journey(`axe: ${role}`, () => step(name, () => scanPages(browser, base, role, paths)), [
        name,
      ]);
    }
  },
};
