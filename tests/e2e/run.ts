/**
 * End-to-end journeys in Debian's Chromium (software WebGL) against the real server.
 *
 *   npm run test:e2e            build the client if needed, start the server, run the journeys
 *
 * The server runs in production mode on a fresh temporary data directory and a random port;
 * the demo seed provides the users. Prints `N passed, N failed` last; exits 1 on any failure.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { chromium, type Browser } from 'playwright-core';
import {
  buildClient,
  CHROMIUM_ARGS,
  CHROMIUM_PATH,
  clientBuildIsStale,
  freePort,
  ROOT,
} from '../../scripts/lib/tooling';
import { outcomes, pageErrors, type E2EJourney, type E2EShared } from './harness';

const CHROMIUM = CHROMIUM_PATH;
const TOTAL_TIMEOUT = 15 * 60_000;

// ---------------------------------------------------------------------------------------------
// Build, server

function buildIfNeeded(): void {
  if (!clientBuildIsStale(ROOT) && process.env.E2E_REBUILD !== '1') return;
  console.log('building the client (vite build)…');
  const status = buildClient(ROOT, 180_000);
  if (status !== 0) throw new Error(`vite build failed (status ${status})`);
}

async function startServer(
  dataDir: string,
): Promise<{ url: string; child: ChildProcess; log: () => string }> {
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  let out = '';
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'production',
    PORT: String(port),
    HOST: '127.0.0.1',
    DATA_DIR: dataDir,
    PUBLIC_URL: url,
    RATE_LIMIT: 'off',
  };
  delete env.VITEST;
  const child = spawn(
    process.execPath,
    [
      path.join(ROOT, 'node_modules', 'tsx', 'dist', 'cli.mjs'),
      path.join(ROOT, 'server', 'index.ts'),
    ],
    {
      cwd: ROOT,
      env,
      stdio: ['ignore', 'pipe', 'pipe'],
      // Own process group, so stopping it also stops the node process tsx starts.
      detached: true,
    },
  );
  child.stdout?.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr?.on('data', (d: Buffer) => (out += d.toString()));
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited (${child.exitCode}):\n${out}`);
    try {
      const res = await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
      if (res.ok) return { url, child, log: () => out };
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  killGroup(child, 'SIGKILL');
  throw new Error(`the server did not answer /api/health within 60 s:\n${out}`);
}

function killGroup(child: ChildProcess, signal: NodeJS.Signals): void {
  if (child.pid === undefined) return;
  try {
    process.kill(-child.pid, signal);
  } catch {
    child.kill(signal);
  }
}

async function stopServer(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  const exited = new Promise<void>((r) => child.once('exit', () => r()));
  killGroup(child, 'SIGTERM');
  const timer = setTimeout(() => killGroup(child, 'SIGKILL'), 5000);
  await exited;
  clearTimeout(timer);
}

// ---------------------------------------------------------------------------------------------

// ---------------------------------------------------------------------------------------------
// Journeys: every file in journeys/ exports E2EJourney objects; they run in file-name order
// on one server, sharing what earlier journeys made through `shared`.

async function loadJourneys(): Promise<E2EJourney[]> {
  const dir = path.join(import.meta.dirname, 'journeys');
  // E2E_ONLY=02,05 runs only the journey files whose names start with one of those prefixes.
  const only = (process.env.E2E_ONLY ?? '')
    .split(',')
    .map((x) => x.trim())
    .filter(Boolean);
  const files = fs
    .readdirSync(dir)
    .filter((f) => f.endsWith('.ts') && (only.length === 0 || only.some((o) => f.startsWith(o))))
    .sort();
  const found: E2EJourney[] = [];
  for (const f of files) {
    const mod = (await import(pathToFileURL(path.join(dir, f)).href)) as Record<string, unknown>;
    for (const v of Object.values(mod)) if (isJourney(v)) found.push(v);
  }
  return found;
}

function isJourney(v: unknown): v is E2EJourney {
  return (
    typeof v === 'object' &&
    v !== null &&
    typeof (v as E2EJourney).run === 'function' &&
    Array.isArray((v as E2EJourney).steps)
  );
}

async function main(): Promise<number> {
  if (!fs.existsSync(CHROMIUM)) {
    console.error(
      `Chromium not found at ${CHROMIUM}: apt-get install -y --no-install-recommends chromium`,
    );
    console.log('0 passed, 1 failed');
    return 1;
  }
  buildIfNeeded();
  const journeys = await loadJourneys();
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'spoolwright-e2e-'));
  let server: Awaited<ReturnType<typeof startServer>> | undefined;
  let browser: Browser | undefined;
  const onSignal = () => {
    // Interrupted: stop the server we started before leaving.
    if (server) killGroup(server.child, 'SIGTERM');
    fs.rmSync(dataDir, { recursive: true, force: true });
    console.log('interrupted');
    console.log(
      `${outcomes.filter((o) => o.ok).length} passed, ${Math.max(1, outcomes.filter((o) => !o.ok).length)} failed`,
    );
    process.exit(130);
  };
  process.once('SIGINT', onSignal);
  process.once('SIGTERM', onSignal);
  stopEverything = () => {
    if (server) killGroup(server.child, 'SIGKILL');
    fs.rmSync(dataDir, { recursive: true, force: true });
  };
  try {
    server = await startServer(dataDir);
    console.log(`server at ${server.url}`);
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      headless: true,
      args: [...CHROMIUM_ARGS],
      timeout: 30_000,
    });
    const shared: E2EShared = {};
    shared.dataDir = dataDir;
    for (const j of journeys) {
      console.log(`== ${j.name}`);
      await j.run(browser, server.url, shared);
    }
  } catch (e) {
    outcomes.push({
      name: 'setup',
      ok: false,
      ms: 0,
      error: e instanceof Error ? e.message : String(e),
    });
    console.log(`setup failed: ${e instanceof Error ? e.message : String(e)}`);
    if (server) console.log(server.log().split('\n').slice(-20).join('\n'));
  } finally {
    await browser?.close().catch(() => undefined);
    if (server) await stopServer(server.child);
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
  const notRun =
    journeys.reduce((n, j) => n + j.steps.length, 0) -
    outcomes.filter((o) => o.name !== 'setup').length;
  if (pageErrors.length > 0)
    console.log(`uncaught page errors (${pageErrors.length}):\n  ${pageErrors.join('\n  ')}`);
  const passed = outcomes.filter((o) => o.ok).length;
  const failed = outcomes.filter((o) => !o.ok).length + Math.max(0, notRun);
  console.log(`${passed} passed, ${failed} failed`);
  return failed === 0 ? 0 : 1;
}

/** Set by main: stops the server and removes the data directory (for the watchdog). */
let stopEverything: (() => void) | undefined;

const watchdog = setTimeout(() => {
  stopEverything?.();
  console.log('e2e run exceeded its time budget');
  console.log(
    `${outcomes.filter((o) => o.ok).length} passed, ${Math.max(1, outcomes.filter((o) => !o.ok).length)} failed`,
  );
  process.exit(1);
}, TOTAL_TIMEOUT);
watchdog.unref();

main().then(
  (code) => process.exit(code),
  (e: unknown) => {
    console.error(e);
    console.log('0 passed, 1 failed');
    process.exit(1);
  },
);
