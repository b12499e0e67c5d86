/**
 * Shared pieces of the end-to-end journeys: step bookkeeping, sign-in, page helpers.
 * Each journey file in `journeys/` imports from here; `run.ts` starts the server and runs them.
 */
import fs from 'node:fs';
import path from 'node:path';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { ROOT } from '../../scripts/lib/tooling';
import { parseMail } from '../../server/mail/mime';

export const RESULTS = path.join(ROOT, 'test-results');
export const PASSWORD = 'spoolwright-demo';
export const STEP_TIMEOUT = 20_000;

/** What journeys hand on to later journeys (ids of spools they made, links, …). */
export interface E2EShared {
  /** The server's DATA_DIR (its mail catcher keeps each message under `mail/`). */
  dataDir?: string;
  spoolId?: string;
  spoolName?: string;
  [key: string]: unknown;
}

/** One journey file's export: its step names (for "not run" accounting) and how to run it. */
export interface E2EJourney {
  name: string;
  steps: readonly string[];
  run: (browser: Browser, base: string, shared: E2EShared) => Promise<void>;
}

/** A fresh browser context of the usual size. */
export function newContext(
  browser: Browser,
  options: Parameters<Browser['newContext']>[0] = {},
): Promise<BrowserContext> {
  return browser.newContext({ viewport: { width: 1440, height: 900 }, ...options });
}

/** Save a screenshot of a page under test-results/ (kept with the e2e results). */
export async function screenshot(page: Page, name: string): Promise<void> {
  fs.mkdirSync(RESULTS, { recursive: true });
  await page.screenshot({ path: path.join(RESULTS, `${name}.png`), fullPage: false });
}

export interface Outcome {
  name: string;
  ok: boolean;
  ms: number;
  error?: string;
}
export const outcomes: Outcome[] = [];
let currentStep = '';
/** Page of the running journey, for a screenshot when a step fails. */
let currentPage: Page | undefined;

/** Run one step of a journey; a failed step stops the journey (the rest are reported as not run). */
export async function step(name: string, fn: () => Promise<void>): Promise<void> {
  const t0 = Date.now();
  currentStep = name;
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      fn(),
      new Promise<never>((_, reject) => {
        timer = setTimeout(
          () => reject(new Error(`step timed out after ${STEP_TIMEOUT * 2} ms`)),
          STEP_TIMEOUT * 2,
        );
      }),
    ]);
    outcomes.push({ name, ok: true, ms: Date.now() - t0 });
    console.log(`  ✓ ${name} (${Date.now() - t0} ms)`);
  } catch (e) {
    const error = e instanceof Error ? e.message.split('\n').slice(0, 6).join('\n') : String(e);
    outcomes.push({ name, ok: false, ms: Date.now() - t0, error });
    if (currentPage) {
      const shot = path.join(RESULTS, `failed-${outcomes.length}.png`);
      fs.mkdirSync(RESULTS, { recursive: true });
      await currentPage.screenshot({ path: shot, timeout: 5000 }).then(
        () => console.log(`      screenshot: ${path.relative(ROOT, shot)}`),
        () => undefined,
      );
    }
    console.log(`  ✕ ${name}\n      ${error.replace(/\n/g, '\n      ')}`);
    throw new JourneyStopped();
  } finally {
    clearTimeout(timer);
  }
}
export class JourneyStopped extends Error {}

export async function journey(
  name: string,
  steps: () => Promise<void>,
  remaining: string[],
): Promise<void> {
  console.log(name);
  const before = outcomes.length;
  try {
    await steps();
  } catch (e) {
    if (!(e instanceof JourneyStopped)) {
      outcomes.push({
        name: `${name}: setup`,
        ok: false,
        ms: 0,
        error: e instanceof Error ? e.message : String(e),
      });
      console.log(`  ✕ ${name}: ${e instanceof Error ? e.message : String(e)}`);
    }
    const ran = new Set(outcomes.slice(before).map((o) => o.name));
    for (const r of remaining) if (!ran.has(r)) console.log(`  – not run: ${r}`);
  }
}

export function expect(cond: unknown, message: string): asserts cond {
  if (!cond) throw new Error(message);
}

// ---------------------------------------------------------------------------------------------
// Page helpers

export async function signIn(page: Page, base: string, email: string): Promise<void> {
  await page.goto(`${base}/spools`);
  await page.waitForURL(/\/sign-in/);
  await page.getByLabel('Email').fill(email);
  await page.getByLabel('Password').fill(PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/spools(\?|$)/);
  await page.getByRole('heading', { name: 'Spool register' }).waitFor();
}

/** Uncaught errors in the pages, reported at the end (they do not fail a journey by themselves). */
export const pageErrors: string[] = [];

export async function openPage(ctx: BrowserContext): Promise<Page> {
  const page = await ctx.newPage();
  currentPage = page;
  page.setDefaultTimeout(STEP_TIMEOUT);
  page.on('pageerror', (e) => pageErrors.push(`${currentStep}: ${e.message}`));
  return page;
}

/** Screen point of an element on the canvas, from the canvas's test hook (null when absent). */
export async function projectElement(
  page: Page,
  id: string,
): Promise<{ x: number; y: number } | null> {
  return page.evaluate((elementId) => {
    const hook = (
      window as unknown as {
        __spoolwright?: { project?: (id: string) => { x: number; y: number } | null };
      }
    ).__spoolwright;
    return hook?.project ? hook.project(elementId) : null;
  }, id);
}

export async function statusOf(page: Page, id: string): Promise<string | null> {
  return page
    .locator(`[data-testid="element-table"] tr[data-element-id="${id}"] [data-check-status]`)
    .getAttribute('data-check-status');
}

// ---------------------------------------------------------------------------------------------

// ---------------------------------------------------------------------------------------------
// Mail: without SMTP_URL the server's catcher keeps each message as DATA_DIR/mail/*.eml.

export interface ReadMailOptions {
  /** Only mail that arrived at or after this time (ms since the epoch). */
  after?: number;
  /** Only mail whose subject matches. */
  subject?: RegExp;
  /** How long to wait for it to arrive (mail may be sent in the background); default 5 s. */
  timeoutMs?: number;
}

/**
 * The decoded text of the newest message to `to` in `dataDir`/mail (waiting for it to arrive);
 * throws when none comes. The one place tests read one-use links (reset, invitation) from.
 */
export async function readMail(
  dataDir: string,
  to: string,
  opts: ReadMailOptions = {},
): Promise<string> {
  const dir = path.join(dataDir, 'mail');
  const want = to.toLowerCase();
  const deadline = Date.now() + (opts.timeoutMs ?? 5000);
  for (;;) {
    const files = fs.existsSync(dir)
      ? fs
          .readdirSync(dir)
          .filter((f) => f.endsWith('.eml'))
          .sort()
          .reverse()
      : [];
    for (const f of files) {
      const file = path.join(dir, f);
      if (opts.after !== undefined && fs.statSync(file).mtimeMs < opts.after - 5) continue;
      const mail = parseMail(fs.readFileSync(file));
      if (!mail.to.includes(want)) continue;
      if (opts.subject && !opts.subject.test(mail.subject)) continue;
      return mail.text;
    }
    if (Date.now() > deadline) throw new Error(`no mail to ${to} in ${dir}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}
