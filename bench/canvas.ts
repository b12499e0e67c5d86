/**
 * Canvas benchmark: builds the stand-alone bench page, serves it on 127.0.0.1, and drives
 * Debian's Chromium (software WebGL) through generated spools of 50, 300 and 1,000
 * elements with antialiasing off and on. Prints frames per second while orbiting and the
 * time from an edit to its new colour on screen (read back from the drawing buffer).
 *
 *   npx tsx bench/canvas.ts [--sizes 50,300,1000] [--seconds 4] [--rounds 2] [--labels auto|all|none] [--no-build] [--screenshots <dir>]
 */
import { createServer, type Server } from 'node:http';
import { loadavg } from 'node:os';
import { readFile, stat } from 'node:fs/promises';
import { extname, join, normalize, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Page } from 'playwright-core';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from '../scripts/lib/tooling';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));
const outDir = join(root, 'node_modules', '.cache', 'canvas-bench');
const entry = 'src/features/sketch/canvas/bench.html';

const args = process.argv.slice(2);
const argValue = (name: string) => {
  const i = args.indexOf(name);
  return i >= 0 ? args[i + 1] : undefined;
};
const sizes = (argValue('--sizes') ?? '50,300,1000').split(',').map(Number);
const seconds = Number(argValue('--seconds') ?? 4);
const skipBuild = args.includes('--no-build');
/** Rounds over all configurations (interleaved, so machine load spreads over all rows). */
const rounds = Math.max(1, Number(argValue('--rounds') ?? 2));
const labels = argValue('--labels') ?? 'auto';
/** Save a screenshot of each configuration into this folder. */
const shotDir = argValue('--screenshots');

const MIME: Record<string, string> = {
  '.html': 'text/html',
  '.js': 'text/javascript',
  '.css': 'text/css',
  '.woff2': 'font/woff2',
  '.woff': 'font/woff',
  '.svg': 'image/svg+xml',
  '.json': 'application/json',
};

async function buildBench() {
  const { build } = await import('vite');
  const t0 = performance.now();
  await build({
    root,
    configFile: join(root, 'vite.config.ts'),
    logLevel: 'warn',
    build: { outDir, emptyOutDir: true, rollupOptions: { input: join(root, entry) } },
  });
  console.log(`built bench page in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
}

function serve(): Promise<{ server: Server; port: number }> {
  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? '/', 'http://127.0.0.1');
      const file = normalize(join(outDir, decodeURIComponent(url.pathname)));
      if (!file.startsWith(outDir)) {
        res.writeHead(403).end();
        return;
      }
      try {
        const s = await stat(file);
        if (!s.isFile()) throw new Error('not a file');
        res.writeHead(200, { 'content-type': MIME[extname(file)] ?? 'application/octet-stream' });
        res.end(await readFile(file));
      } catch {
        res.writeHead(404).end('not found');
      }
    })();
  });
  return new Promise((ok) => {
    server.listen(0, '127.0.0.1', () => {
      const addr = server.address();
      ok({ server, port: typeof addr === 'object' && addr ? addr.port : 0 });
    });
  });
}

interface Row {
  elements: number;
  /** Elements selected right by a mouse click at project(id), of those tried. */
  picked: [number, number];
  antialias: boolean;
  firstFrameMs: number;
  fps: number;
  /** fps of every round. */
  fpsRuns?: number[];
  /** Mean time in three.js render() per frame. */
  renderMs: number;
  editMs: number[];
  calls: number;
  triangles: number;
  renderer: string;
}

async function measure(
  page: Page,
  base: string,
  n: number,
  aa: boolean,
  pick: boolean,
): Promise<Row> {
  const t0 = Date.now();
  await page.goto(`${base}/${entry}?n=${n}&aa=${aa ? 1 : 0}&labels=${labels}`);
  await page.waitForFunction(() => (window.__spoolwright?.frames ?? 0) > 0, undefined, {
    timeout: 120_000,
  });
  const firstFrameMs = Date.now() - t0;
  // Warm up, then orbit for `seconds`, one small step per animation frame.
  const { fps, renderMs } = await page.evaluate(async (secs) => {
    const hooks = window.__spoolwright!;
    const orbit = (ms: number) =>
      new Promise<number>((done) => {
        const start = performance.now();
        const f0 = hooks.frames;
        const tick = () => {
          const now = performance.now();
          if (now - start >= ms) {
            done(((hooks.frames - f0) * 1000) / (now - start));
            return;
          }
          hooks.orbitBy(0.01);
          requestAnimationFrame(tick);
        };
        requestAnimationFrame(tick);
      });
    await orbit(800);
    // Time spent in three.js render calls (JS + queuing GL commands; the software rasteriser
    // runs in Chromium's GPU process beside it).
    const renderer = hooks.renderer as unknown as { render: (...a: unknown[]) => void };
    const original = renderer.render;
    let renderMs = 0;
    let renders = 0;
    renderer.render = function (this: unknown, ...a: unknown[]) {
      const t = performance.now();
      original.apply(this, a);
      renderMs += performance.now() - t;
      renders++;
    };
    const result = await orbit(secs * 1000);
    renderer.render = original;
    return { fps: result, renderMs: renders ? renderMs / renders : 0 };
  }, seconds);
  const info = await page.evaluate(() => {
    window.__spoolwright!.fit();
    return window.__spoolwright!.info();
  });
  if (shotDir) {
    await page.waitForTimeout(300);
    await page.screenshot({ path: join(shotDir, `canvas-${n}-${aa ? 'aa' : 'noaa'}.png`) });
  }
  // Edit → colour: alternate a straight between a failing and a passing schedule and wait for
  // the pixel under its mid-point to change.
  const editMs = await page.evaluate(async (count) => {
    const hooks = window.__spoolwright!;
    const frame = () => new Promise((r) => requestAnimationFrame(r));
    // Let the view come back to full resolution after orbiting.
    await new Promise((r) => setTimeout(r, 600));
    await frame();
    await frame();
    const els = hooks.store.getState().doc.elements;
    const straights = els.filter((e) => e.kind === 'straight');
    const target = straights[straights.length - 1]!;
    const times: number[] = [];
    // A 5 × 5 patch around the mid-point: thin pipes may be only a few pixels wide.
    const patch = (x: number, y: number) => {
      const out: string[] = [];
      for (let dx = -2; dx <= 2; dx++)
        for (let dy = -2; dy <= 2; dy++)
          out.push((hooks.readPixel(x + dx, y + dy) ?? []).join(','));
      return out.join(';');
    };
    for (let i = 0; i < count; i++) {
      const p = hooks.project(target.id)!;
      const before = patch(p.x, p.y);
      const schedule = i % 2 === 0 ? '5' : '160';
      const t = performance.now();
      hooks.store.getState().updateElement(target.id, { schedule }, { history: 'never' });
      for (;;) {
        await frame();
        const now = patch(p.x, p.y);
        if (now !== before) break;
        if (performance.now() - t > 5000) {
          times.push(Number.NaN);
          break;
        }
      }
      if (times.length === i) times.push(performance.now() - t);
      await frame();
    }
    return times;
  }, 6);
  // Picking: click up to 60 elements (evenly spread) at their projected points.
  let picked: [number, number] = [0, 0];
  if (!aa && pick) {
    const ids = await page.evaluate(() =>
      window.__spoolwright!.store.getState().doc.elements.map((e) => e.id),
    );
    const stride = Math.max(1, Math.floor(ids.length / 60));
    for (let i = 0; i < ids.length; i += stride) {
      const id = ids[i]!;
      const p = await page.evaluate((el) => window.__spoolwright!.project(el), id);
      if (!p) continue;
      await page.mouse.click(p.x, p.y);
      const sel = await page.evaluate(() => window.__spoolwright!.store.getState().selectedId);
      picked = [picked[0] + (sel === id ? 1 : 0), picked[1] + 1];
    }
    await page.mouse.move(1, 1);
  }
  return {
    elements: n,
    picked,
    antialias: aa,
    firstFrameMs,
    fps,
    renderMs,
    editMs,
    calls: info.calls,
    triangles: info.triangles,
    renderer: info.renderer,
  };
}

const fpsCell = (runs: number[]) => {
  const sorted = [...runs].sort((a, b) => a - b);
  const mid = sorted[Math.floor(sorted.length / 2)]!;
  return sorted.length > 1
    ? `${mid.toFixed(1)} (${sorted[0]!.toFixed(1)}–${sorted[sorted.length - 1]!.toFixed(1)})`
    : mid.toFixed(1);
};

const median = (xs: number[]) => {
  const s = xs.filter(Number.isFinite).sort((a, b) => a - b);
  return s.length === 0 ? Number.NaN : s[Math.floor(s.length / 2)]!;
};

async function main() {
  if (!skipBuild) await buildBench();
  const { server, port } = await serve();
  const browser = await chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [...CHROMIUM_ARGS],
  });

  const rows: Row[] = [];
  const loadBefore = loadavg()[0]!;
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    // tsx keeps function names with a __name helper that page.evaluate bodies then call.
    await page.addInitScript({ content: 'window.__name = (f) => f;' });
    page.on('pageerror', (e) => console.error('page error:', e.message));
    for (let round = 0; round < rounds; round++) {
      let k = 0;
      for (const n of sizes) {
        for (const aa of [false, true]) {
          const row = await measure(page, `http://127.0.0.1:${port}`, n, aa, round === 0);
          const prev = rows[k];
          if (!prev) rows.push({ ...row, fpsRuns: [row.fps] });
          else {
            prev.fpsRuns!.push(row.fps);
            prev.editMs.push(...row.editMs);
            prev.renderMs = Math.max(prev.renderMs, row.renderMs);
          }
          k++;
          console.log(
            `round ${round + 1}: ${n} elements, antialias ${aa ? 'on' : 'off'}: ${row.fps.toFixed(1)} fps`,
          );
        }
      }
    }
  } finally {
    await browser.close();
    server.close();
  }
  console.log(
    `\nrenderer: ${rows[0]?.renderer ?? '?'}; bench page 1280×720 CSS px (canvas under a status strip), DPR 1; orbit ${seconds} s per row and round, ${rounds} round(s)`,
  );
  console.log(
    `load average (1 min) before/after: ${loadBefore.toFixed(2)} / ${loadavg()[0]!.toFixed(2)} on a machine with 2 cores`,
  );
  console.log(
    '| elements | antialias | first frame (ms) | fps orbiting, median (range) | render() JS ms/frame | edit → colour median (ms) | edit → colour max (ms) | draw calls | triangles | click picks right |',
  );
  console.log('|---:|:---:|---:|---:|---:|---:|---:|---:|---:|---:|');
  for (const r of rows) {
    const finite = r.editMs.filter(Number.isFinite);
    console.log(
      `| ${r.elements} | ${r.antialias ? 'on' : 'off'} | ${r.firstFrameMs} | ${fpsCell(r.fpsRuns ?? [r.fps])} | ${r.renderMs.toFixed(1)} | ${median(r.editMs).toFixed(0)} | ${finite.length ? Math.max(...finite).toFixed(0) : 'n/a'} | ${r.calls} | ${r.triangles} | ${r.antialias ? '' : `${r.picked[0]}/${r.picked[1]}`} |`,
    );
  }
}

main().catch((e: unknown) => {
  console.error(e);
  process.exitCode = 1;
});
