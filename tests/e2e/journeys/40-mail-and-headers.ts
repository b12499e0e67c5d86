/**
 * The Content-Security-Policy lets the built app work (register, sketcher with its 3D canvas,
 * Barlow fonts) without a single violation; password-reset mail reaches the addressee's mailbox
 * (DATA_DIR/mail) with a working one-use link, and the admin outbox shows it redacted.
 */
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
} from '../harness';

const STEPS = [
  'the register, the sketcher and the calc sheet load under the Content-Security-Policy with no violation',
  'a password-reset mail arrives in the mailbox, its link works once, the outbox hides it',
];

export const mailAndHeadersJourney: E2EJourney = {
  name: 'mail and headers',
  steps: STEPS,
  async run(browser, base, shared) {
    const ctx = await newContext(browser);
    await journey(
      'content security policy and mail',
      async () => {
        const page = await openPage(ctx);
        const violations: string[] = [];
        await page.addInitScript(() => {
          const w = window as unknown as { __csp: string[] };
          w.__csp = [];
          document.addEventListener('securitypolicyviolation', (e) =>
            w.__csp.push(`${e.violatedDirective} ${e.blockedURI}`),
          );
        });
        page.on('console', (m) => {
          if (/Content Security Policy/i.test(m.text())) violations.push(m.text());
        });

        await step(STEPS[0]!, async () => {
          const res = await page.goto(`${base}/sign-in`);
          const csp = res?.headers()['content-security-policy'] ?? '';
          expect(csp.includes("script-src 'self'"), `CSP header missing or unexpected: "${csp}"`);
          await signIn(page, base, 'admin@spoolwright.test');
          const list = await page.request.get(`${base}/api/spools?pageSize=1`);
          const id = ((await list.json()) as { items: { id: string }[] }).items[0]?.id;
          expect(id, 'the demo register has no spool');
          await page.goto(`${base}/spools/${id}`);
          await page.getByTestId('sketcher').waitFor();
          await page.locator('canvas').first().waitFor();
          await page.waitForTimeout(1000);
          const fontsOk = await page.evaluate(async () => {
            await document.fonts.ready;
            return document.fonts.check('600 16px Barlow');
          });
          expect(fontsOk, 'the Barlow font did not load');
          await screenshot(page, 'csp-sketcher');
          // Each document starts its own list: read the sketcher's before moving on.
          const readSeen = () =>
            page.evaluate(() => (window as unknown as { __csp: string[] }).__csp);
          const seen = await readSeen();
          // The calc sheet print view too.
          await page.goto(`${base}/spools/${id}/calc-sheet`);
          await page.getByTestId('calc-sheet').waitFor();
          await page.waitForTimeout(500);
          seen.push(...(await readSeen()));
          expect(
            seen.length === 0 && violations.length === 0,
            `CSP violations: ${[...seen, ...violations].join('; ')}`,
          );
        });

        await step(STEPS[1]!, async () => {
          expect(shared.dataDir, 'the e2e runner did not pass its data dir');
          // A member of our own, so no other journey's sessions are revoked by the reset.
          const email = `reset-${Date.now()}@spoolwright.test`;
          const add = await page.request.post(`${base}/api/team/members`, {
            data: { email, name: 'Rosa Resetti', role: 'designer', password: 'first-password-1' },
            headers: { origin: base },
          });
          expect(add.status() === 201, `adding a member: ${add.status()} ${await add.text()}`);
          const sentAfter = Date.now();
          const req = await page.request.post(`${base}/api/auth/request-password-reset`, {
            data: { email },
            headers: { origin: base },
          });
          expect(req.ok(), `reset request: ${req.status()}`);
          const text = await readMail(shared.dataDir!, email, {
            subject: /reset/i,
            after: sentAfter,
            timeoutMs: 10_000,
          });
          const link = new RegExp(
            `${base.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')}/reset-password\\?token=([^\\s&]+)`,
          ).exec(text);
          expect(link, `no reset link in the mail:\n${text}`);
          const token = decodeURIComponent(link[1]!);
          const outbox = await page.request.get(`${base}/api/admin/outbox`);
          const body = await outbox.text();
          expect(outbox.ok() && body.includes(email), 'the outbox does not list the reset mail');
          expect(!body.includes(token), 'the outbox shows the reset token');
          const anon = await newContext(browser);
          const set = await anon.request.post(`${base}/api/auth/reset-password`, {
            data: { token, newPassword: 'second-password-2' },
            headers: { origin: base },
          });
          expect(set.ok(), `reset: ${set.status()} ${await set.text()}`);
          const reuse = await anon.request.post(`${base}/api/auth/reset-password`, {
            data: { token, newPassword: 'third-password-3' },
            headers: { origin: base },
          });
          expect(reuse.status() === 400, `a used token worked again (${reuse.status()})`);
          const login = await anon.request.post(`${base}/api/auth/sign-in/email`, {
            data: { email, password: 'second-password-2' },
            headers: { origin: base },
          });
          expect(login.ok(), `sign-in with the new password: ${login.status()}`);
          await anon.close();
        });
      },
      STEPS,
    );
    await ctx.close();
  },
};
