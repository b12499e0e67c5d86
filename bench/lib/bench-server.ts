/**
 * The server the HTTP benchmarks measure: a production-mode process on a fresh embedded
 * database (or DATABASE_URL) on a free loopback port, stopped and removed when the bench exits.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { freePort } from '../../scripts/lib/tooling';

export interface BenchServer {
  url: string;
  child: ChildProcess;
  /** Stop the server (also done on exit). */
  stop: () => void;
}

export async function startBenchServer(
  root: string,
  opts: { tmpPrefix: string; env?: NodeJS.ProcessEnv },
): Promise<BenchServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), opts.tmpPrefix));
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'server/index.ts')], {
    cwd: root,
    env: {
      ...process.env,
      NODE_ENV: 'production',
      DATA_DIR: dataDir,
      PORT: String(port),
      HOST: '127.0.0.1',
      SPOOLWRIGHT_QUIET: '1',
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise<void>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('Spoolwright is running at')) resolve();
    });
    child.once('exit', (code) => reject(new Error(`server exited ${code}: ${out}`)));
  });
  const stop = () => {
    if (child.exitCode === null) child.kill('SIGTERM');
  };
  process.on('exit', () => {
    stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  });
  return { url, child, stop };
}

/** Sign in a demo user; the request headers of that session for JSON calls. */
export async function signInHeaders(url: string, email: string): Promise<Record<string, string>> {
  const signIn = await fetch(`${url}/api/auth/sign-in/email`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: url },
    body: JSON.stringify({ email, password: 'spoolwright-demo' }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in failed: ${signIn.status}`);
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  return { cookie, origin: url, 'content-type': 'application/json' };
}
