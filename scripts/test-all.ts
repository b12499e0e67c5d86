/**
 * Every test CI runs, in one command: typecheck, lint, the vitest suites, the server suite
 * again on a real PostgreSQL server, and the Chromium end-to-end journey.
 *
 * On a machine without Debian's chromium, python3-fluids or postgresql it installs them with
 * apt-get when it runs as root, and otherwise says what is missing. It prints a closing line
 * "N passed, N failed" and exits non-zero when anything failed.
 */
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, chownSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { freePort } from './lib/tooling';

const ROOT = join(import.meta.dirname, '..');
let passed = 0;
let failed = 0;
const problems: string[] = [];

function log(msg: string): void {
  process.stdout.write(`\n== ${msg}\n`);
}

function run(cmd: string, args: string[], env: NodeJS.ProcessEnv = {}): Promise<number> {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, {
      cwd: ROOT,
      stdio: 'inherit',
      env: { ...process.env, ...env },
    });
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

function have(cmd: string): boolean {
  return spawnSync('sh', ['-c', `command -v ${cmd}`], { stdio: 'ignore' }).status === 0;
}

function ensureDebianPackages(): void {
  const missing: string[] = [];
  if (!existsSync('/usr/bin/chromium')) missing.push('chromium');
  if (spawnSync('/usr/bin/python3', ['-c', 'import fluids'], { stdio: 'ignore' }).status !== 0)
    missing.push('python3-fluids');
  if (!postgresBin()) missing.push('postgresql');
  if (!existsSync('/usr/bin/pdftotext')) missing.push('poppler-utils');
  if (missing.length === 0) return;
  const isRoot = process.getuid?.() === 0;
  if (isRoot && have('apt-get')) {
    log(`installing Debian packages: ${missing.join(' ')}`);
    spawnSync('apt-get', ['update'], { stdio: 'inherit' });
    spawnSync('apt-get', ['install', '-y', '--no-install-recommends', ...missing], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
  } else {
    process.stdout.write(
      `note: missing Debian packages (${missing.join(', ')}); install them with: sudo apt-get install -y ${missing.join(' ')}\n`,
    );
  }
}

function postgresBin(): string | null {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = (spawnSync('ls', [base], { encoding: 'utf8' }).stdout ?? '')
    .split('\n')
    .filter(Boolean)
    .sort();
  const v = versions.at(-1);
  return v && existsSync(join(base, v, 'bin', 'initdb')) ? join(base, v, 'bin') : null;
}

/** Start a throwaway PostgreSQL server on loopback; returns its URL and a stop function. */
async function startPostgres(): Promise<{ url: string; stop: () => void } | null> {
  const bin = postgresBin();
  if (!bin) return null;
  const dir = mkdtempSync(join(tmpdir(), 'spoolwright-pg-'));
  const port = await freePort();
  const asRoot = process.getuid?.() === 0;
  // initdb refuses to run as root: run the server as Debian's postgres user.
  const wrap = (args: string[]): [string, string[]] =>
    asRoot ? ['runuser', ['-u', 'postgres', '--', ...args]] : [args[0] ?? '', args.slice(1)];
  if (asRoot) {
    const id = spawnSync('id', ['-u', 'postgres'], { encoding: 'utf8' });
    const gid = spawnSync('id', ['-g', 'postgres'], { encoding: 'utf8' });
    chownSync(dir, Number(id.stdout.trim()), Number(gid.stdout.trim()));
  }
  const [c1, a1] = wrap([
    join(bin, 'initdb'),
    '-D',
    join(dir, 'db'),
    '-U',
    'postgres',
    '--auth=trust',
    '-E',
    'UTF8',
  ]);
  if (spawnSync(c1, a1, { stdio: 'ignore' }).status !== 0) return null;
  const [c2, a2] = wrap([
    join(bin, 'pg_ctl'),
    '-D',
    join(dir, 'db'),
    '-o',
    `-p ${port} -k ${dir} -c listen_addresses=127.0.0.1`,
    '-l',
    join(dir, 'log'),
    '-w',
    'start',
  ]);
  if (spawnSync(c2, a2, { stdio: 'ignore' }).status !== 0) return null;
  const stop = () => {
    const [c3, a3] = wrap([join(bin, 'pg_ctl'), '-D', join(dir, 'db'), '-m', 'fast', '-w', 'stop']);
    spawnSync(c3, a3, { stdio: 'ignore' });
    rmSync(dir, { recursive: true, force: true });
  };
  return { url: `postgres://postgres@127.0.0.1:${port}/postgres`, stop };
}

interface VitestJson {
  numPassedTests: number;
  numFailedTests: number;
  numTotalTests: number;
  success: boolean;
}

async function vitest(label: string, args: string[], env: NodeJS.ProcessEnv = {}): Promise<void> {
  log(label);
  const out = join(mkdtempSync(join(tmpdir(), 'spoolwright-vitest-')), 'result.json');
  const code = await run(
    'npx',
    ['vitest', 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${out}`, ...args],
    env,
  );
  if (existsSync(out)) {
    const r = JSON.parse(readFileSync(out, 'utf8')) as VitestJson;
    passed += r.numPassedTests;
    failed += r.numFailedTests;
    if (r.numFailedTests > 0 || code !== 0)
      problems.push(`${label}: ${r.numFailedTests} failed (exit ${code})`);
    if (code !== 0 && r.numFailedTests === 0) failed += 1;
  } else {
    failed += 1;
    problems.push(`${label}: vitest exited ${code} without results`);
  }
}

async function step(label: string, cmd: string, args: string[]): Promise<void> {
  log(label);
  const code = await run(cmd, args);
  if (code === 0) passed += 1;
  else {
    failed += 1;
    problems.push(`${label}: exit ${code}`);
  }
}

async function main(): Promise<void> {
  ensureDebianPackages();
  await step('typecheck', 'npm', ['run', '--silent', 'typecheck']);
  await step('lint', 'npm', ['run', '--silent', 'lint']);
  await vitest('unit, engine, CLI, server, store and component suites', []);
  await step('bundle budget (shell gzip, builds the client)', 'npx', [
    'tsx',
    'scripts/bundle-budget.ts',
  ]);

  const pg = process.env.TEST_DATABASE_URL
    ? { url: process.env.TEST_DATABASE_URL, stop: () => undefined }
    : await startPostgres();
  if (pg) {
    try {
      await vitest('server suite on a PostgreSQL server', ['--passWithNoTests', 'tests/server'], {
        TEST_DATABASE_URL: pg.url,
      });
    } finally {
      pg.stop();
    }
  } else if (process.env.CI) {
    failed += 1;
    problems.push('PostgreSQL server variant: no PostgreSQL server could be started');
  } else {
    process.stdout.write('note: skipped the PostgreSQL-server variant (no postgresql installed)\n');
  }

  if (existsSync(join(ROOT, 'tests', 'e2e', 'run.ts'))) {
    log('end-to-end in Chromium');
    const code = await run('npx', ['tsx', 'tests/e2e/run.ts']);
    if (code === 0) passed += 1;
    else {
      failed += 1;
      problems.push(`end-to-end: exit ${code}`);
    }
  }

  log('summary');
  for (const p of problems) process.stdout.write(`FAILED ${p}\n`);
  process.stdout.write(`${passed} passed, ${failed} failed\n`);
  process.exitCode = failed > 0 ? 1 : 0;
}

void main();
