import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { ROOT, getFreePort } from './helpers';

/** A `tsx server/index.ts` child on a temp data directory and a free loopback port. */
export interface ServerProcess {
  child: ChildProcess;
  url: string;
  port: number;
  output: () => string;
  /** Resolves with the exit code (or signal) once the process has gone. */
  exited: Promise<number | string>;
}

export async function spawnServer(
  dataDir: string,
  opts: { port?: number; env?: Record<string, string>; waitReady?: boolean } = {},
): Promise<ServerProcess> {
  const port = opts.port ?? (await getFreePort());
  const child = spawn(process.execPath, ['--import', 'tsx', path.join(ROOT, 'server/index.ts')], {
    cwd: ROOT,
    env: {
      ...process.env,
      DATA_DIR: dataDir,
      PORT: String(port),
      HOST: '127.0.0.1',
      RATE_LIMIT: 'off',
      SPOOLWRIGHT_QUIET: '1',
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (d: Buffer) => (out += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (out += d.toString()));
  const exited = new Promise<number | string>((resolve) =>
    child.once('exit', (code, signal) => resolve(code ?? signal ?? -1)),
  );
  const proc: ServerProcess = {
    child,
    url: `http://127.0.0.1:${port}`,
    port,
    output: () => out,
    exited,
  };
  if (opts.waitReady !== false) {
    await Promise.race([
      new Promise<void>((resolve, reject) => {
        const timer = setInterval(() => {
          if (out.includes('Spoolwright is running at')) {
            clearInterval(timer);
            resolve();
          }
        }, 25);
        void exited.then((code) => {
          clearInterval(timer);
          reject(new Error(`server exited (${code}) before it was ready: ${out}`));
        });
      }),
      new Promise<void>((_, reject) =>
        setTimeout(() => reject(new Error(`server not ready in 120 s: ${out}`)), 120_000),
      ),
    ]);
  }
  return proc;
}

/** Stop a child we started (by its pid) and wait until it is gone. */
export async function stopServer(p: ServerProcess, signal: NodeJS.Signals = 'SIGTERM') {
  if (p.child.exitCode === null && p.child.signalCode === null) p.child.kill(signal);
  return p.exited;
}

/** Sign in over HTTP; returns the Cookie header for later requests. */
export async function signInCookie(url: string, email: string, password: string): Promise<string> {
  const r = await fetch(`${url}/api/auth/sign-in/email`, {
    method: 'POST',
    // Sent like a browser page on the app's own origin would (node's fetch sets sec-fetch-mode).
    headers: { 'content-type': 'application/json', origin: url },
    body: JSON.stringify({ email, password }),
  });
  if (r.status !== 200) throw new Error(`sign-in failed: ${r.status} ${await r.text()}`);
  return r.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
}

export async function api(url: string, cookie: string, method: string, p: string, body?: unknown) {
  const r = await fetch(`${url}${p}`, {
    method,
    headers: {
      cookie,
      origin: url,
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
    },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await r.text();
  return { status: r.status, body: text ? (JSON.parse(text) as Record<string, unknown>) : {} };
}
