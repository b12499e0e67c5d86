/**
 * Bundle budget: the JavaScript a browser must load before the first screen (the entry chunk
 * named in dist/index.html plus every chunk it preloads or imports statically), gzip-compressed.
 *
 *   npx tsx scripts/bundle-budget.ts        builds the client if stale, prints the figures,
 *                                           exits 1 above the budget
 *
 * Lazy chunks (the sketcher, the 3D canvas, the other pages) are listed but not counted.
 */
import fs from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { buildClient, clientBuildIsStale, ROOT } from './lib/tooling';

/** The shell's budget in kB (1 kB = 1000 bytes), gzip. */
export const SHELL_BUDGET_KB = 120;

const DIST = path.join(ROOT, 'dist');
const gz = (file: string) => gzipSync(fs.readFileSync(file), { level: 9 }).length;

/** Static imports of a built chunk: `import … from "./x.js"` and bare `import "./x.js"`. */
function staticImports(file: string): string[] {
  const code = fs.readFileSync(file, 'utf8');
  const found = new Set<string>();
  for (const m of code.matchAll(
    /(?:^|[;\s}])import\s*(?:[\w$*{}\s,]+from\s*)?["']\.\/([^"']+\.js)["']/g,
  ))
    found.add(m[1]!);
  return [...found].map((f) => path.join(path.dirname(file), f));
}

export function measureShell(): {
  shellBytes: number;
  files: { file: string; bytes: number }[];
  lazy: { file: string; bytes: number }[];
} {
  const html = fs.readFileSync(path.join(DIST, 'index.html'), 'utf8');
  const refs = [...html.matchAll(/(?:src|href)="\/(assets\/[^"]+\.js)"/g)].map((m) =>
    path.join(DIST, m[1]!),
  );
  const seen = new Set<string>();
  const queue = [...refs];
  while (queue.length > 0) {
    const f = queue.pop()!;
    if (seen.has(f)) continue;
    seen.add(f);
    queue.push(...staticImports(f));
  }
  const files = [...seen].map((file) => ({ file: path.relative(DIST, file), bytes: gz(file) }));
  const all = fs.readdirSync(path.join(DIST, 'assets')).filter((f) => f.endsWith('.js'));
  const lazy = all
    .map((f) => path.join(DIST, 'assets', f))
    .filter((f) => !seen.has(f))
    .map((file) => ({ file: path.relative(DIST, file), bytes: gz(file) }))
    .sort((a, b) => b.bytes - a.bytes);
  return { shellBytes: files.reduce((n, f) => n + f.bytes, 0), files, lazy };
}

function main(): number {
  if (clientBuildIsStale(ROOT) || !fs.existsSync(path.join(DIST, 'index.html'))) {
    const status = buildClient(ROOT, 300_000);
    if (status !== 0) {
      console.log(`vite build failed (status ${status})`);
      return 1;
    }
  }
  const { shellBytes, files, lazy } = measureShell();
  const kb = (b: number) => (b / 1000).toFixed(1);
  console.log('shell (loaded before the first screen), gzip:');
  for (const f of files) console.log(`  ${kb(f.bytes).padStart(7)} kB  ${f.file}`);
  console.log(`  ${kb(shellBytes).padStart(7)} kB  total (budget ${SHELL_BUDGET_KB} kB)`);
  console.log('lazy chunks, gzip (largest first):');
  for (const f of lazy.slice(0, 8)) console.log(`  ${kb(f.bytes).padStart(7)} kB  ${f.file}`);
  if (shellBytes > SHELL_BUDGET_KB * 1000) {
    console.log(`over budget: the shell is ${kb(shellBytes)} kB gzip, above ${SHELL_BUDGET_KB} kB`);
    return 1;
  }
  return 0;
}

process.exitCode = main();
