import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

// `npm start`: build the client when dist/ is missing or older than its sources, then run the
// server in production mode on the embedded database (demo data on first start).

const root = fileURLToPath(new URL('..', import.meta.url));
const distIndex = path.join(root, 'dist', 'index.html');

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

function needsBuild(): boolean {
  if (!fs.existsSync(distIndex)) return true;
  const built = fs.statSync(distIndex).mtimeMs;
  const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'tailwind.config.ts'].map((p) => newestMtime(path.join(root, p)));
  return Math.max(...inputs) > built;
}

if (needsBuild()) {
  console.log('Building the web client (vite build)…');
  const r = spawnSync('npx', ['vite', 'build', '--logLevel', 'warn'], { cwd: root, stdio: 'inherit', env: process.env });
  if (r.status !== 0) {
    console.error('The client build failed; see the output above.');
    process.exit(r.status ?? 1);
  }
}

process.env.NODE_ENV = 'production';
process.chdir(root);
const { runMain } = await import('../server/index');
await runMain();
