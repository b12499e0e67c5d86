/**
 * Task-script helpers shared by `npm start`, the test runner, the end-to-end run and the
 * benchmarks: client build freshness, free loopback ports and the headless Chromium launch.
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));

/** Debian's Chromium (never a downloaded browser); `CHROMIUM_PATH` overrides. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH || '/usr/bin/chromium';

/** Flags for headless Chromium with software WebGL (SwiftShader) on a closed network. */
export const CHROMIUM_ARGS: readonly string[] = [
  '--no-sandbox',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
];

function newestMtime(p: string): number {
  let st: fs.Stats;
  try {
    st = fs.statSync(p);
  } catch {
    return 0;
  }
  if (!st.isDirectory()) return st.mtimeMs;
  let newest = 0;
  for (const entry of fs.readdirSync(p)) {
    if (entry === 'node_modules' || entry.startsWith('.')) continue;
    newest = Math.max(newest, newestMtime(path.join(p, entry)));
  }
  return newest;
}

/** True when dist/index.html is missing or older than any client source. */
export function clientBuildIsStale(root = ROOT): boolean {
  const index = path.join(root, 'dist', 'index.html');
  if (!fs.existsSync(index)) return true;
  const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts'].map((p) =>
    newestMtime(path.join(root, p)),
  );
  return Math.max(...inputs) > fs.statSync(index).mtimeMs;
}

/** Run `vite build`; returns the exit status. */
export function buildClient(root = ROOT, timeoutMs = 300_000): number {
  const r = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], {
    cwd: root,
    stdio: 'inherit',
    env: process.env,
    timeout: timeoutMs,
  });
  return r.status ?? 1;
}

/** A free port on 127.0.0.1. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
  });
}
