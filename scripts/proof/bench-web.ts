// The front-end budget: gzip size of what the first page load fetches, and frames per second on the board map
// with 1,000 test points while it is panned and zoomed, measured in the page with requestAnimationFrame, and the
// time from a reading saved to the ranking updated on screen (bench-save.ts).
import { chromium } from '@playwright/test';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { extname, join, normalize } from 'node:path';
import { gzipSync } from 'node:zlib';
import playwrightConfig from '../../playwright.config';
import { buildWeb, WEB_DIST } from '../lib/stack';
import { measureSaveToRanking, type SaveFigures } from './bench-save';
import { loadAverage as currentLoad, machineSize, percentile } from './env';

export const WEB_TARGETS = { firstLoadKb: 250, fps: 55, saveP95Ms: 150 };

export interface FirstLoad {
  files: { file: string; bytes: number; gzip: number }[];
  jsGzip: number;
  cssGzip: number;
}

/** The entry script and stylesheet named in dist/index.html, and the chunks it preloads. */
export function firstLoad(dist: string): FirstLoad {
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const refs = new Set<string>();
  for (const m of html.matchAll(/<script[^>]*\bsrc="([^"]+)"/g)) refs.add(m[1]!);
  for (const m of html.matchAll(/<link[^>]*\brel="(?:stylesheet|modulepreload)"[^>]*\bhref="([^"]+)"/g)) refs.add(m[1]!);
  for (const m of html.matchAll(/<link[^>]*\bhref="([^"]+)"[^>]*\brel="(?:stylesheet|modulepreload)"/g)) refs.add(m[1]!);
  const files = [...refs].map((ref) => {
    const data = readFileSync(join(dist, ref.replace(/^\//, '')));
    return { file: ref, bytes: data.length, gzip: gzipSync(data).length };
  });
  const sum = (ext: string) => files.filter((f) => f.file.endsWith(ext)).reduce((a, f) => a + f.gzip, 0);
  return { files, jsGzip: sum('.js'), cssGzip: sum('.css') };
}

const TYPES: Record<string, string> = {
  '.js': 'text/javascript',
  '.css': 'text/css',
  '.html': 'text/html',
  '.svg': 'image/svg+xml',
  '.woff2': 'font/woff2',
  '.png': 'image/png',
};

/** A static server for the built app (the perf page needs no API): files as they are, index.html for routes. */
function serveDist(dist: string): Promise<{ server: Server; url: string }> {
  const server = createServer((req, res) => {
    const path = normalize(decodeURIComponent((req.url ?? '/').split('?')[0]!)).replace(/^(\.\.[/\\])+/, '');
    let file = join(dist, path);
    if (!file.startsWith(dist) || !existsSync(file) || statSync(file).isDirectory()) file = join(dist, 'index.html');
    res.writeHead(200, { 'content-type': TYPES[extname(file)] ?? 'application/octet-stream' });
    res.end(readFileSync(file));
  });
  return new Promise((resolve) =>
    server.listen(0, '127.0.0.1', () => resolve({ server, url: `http://127.0.0.1:${(server.address() as { port: number }).port}` })),
  );
}

export interface FrameFigures {
  points: number;
  seconds: number;
  frames: number;
  fps: number;
  p95FrameMs: number;
}

/** Drags the map back and forth and zooms in and out with the wheel for `seconds`, counting frames in the page. */
async function measureFrames(url: string, points: number, seconds: number): Promise<FrameFigures> {
  const browser = await chromium.launch(playwrightConfig.use?.launchOptions);
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } });
    await page.goto(`${url}/dev/perf?points=${points}`);
    const map = page.getByTestId('perf-map').locator('canvas').first();
    await map.waitFor();
    const box = (await map.boundingBox())!;
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    // Page code as a string: the scripts project has no DOM types.
    await page.evaluate(`window.__frames = []; (function tick(t) { window.__frames.push(t); requestAnimationFrame(tick); })(performance.now());`);
    const end = Date.now() + seconds * 1000;
    for (let round = 0; Date.now() < end; round++) {
      await page.mouse.move(cx, cy);
      await page.mouse.down();
      for (let s = 1; s <= 20; s++) await page.mouse.move(cx + Math.sin((s / 20) * Math.PI * 2) * 200, cy + s * (round % 2 ? -6 : 6));
      await page.mouse.up();
      for (let s = 0; s < 10; s++) await page.mouse.wheel(0, round % 2 ? 120 : -120);
    }
    const times = (await page.evaluate('window.__frames')) as number[];
    const gaps = times
      .slice(1)
      .map((t, i) => t - times[i]!)
      .sort((a, b) => a - b);
    const span = (times[times.length - 1]! - times[0]!) / 1000;
    return { points, seconds: span, frames: times.length - 1, fps: (times.length - 1) / span, p95FrameMs: percentile(gaps, 95) };
  } finally {
    await browser.close();
  }
}

export interface WebBenchReport {
  load: FirstLoad;
  frames: FrameFigures;
  save: SaveFigures;
  machine: string;
  /** The load average when the run started. */
  loadAverage: string;
  ok: boolean;
}

export async function runWebBench({ points = 1000, seconds = 5, saves = 30, log = console.log } = {}): Promise<WebBenchReport> {
  const loadAverage = await currentLoad();
  await buildWeb();
  const load = firstLoad(WEB_DIST);
  const { server, url } = await serveDist(WEB_DIST);
  try {
    const frames = await measureFrames(url, points, seconds);
    const save = await measureSaveToRanking(saves, log);
    const ok = (load.jsGzip + load.cssGzip) / 1024 <= WEB_TARGETS.firstLoadKb && frames.fps >= WEB_TARGETS.fps && save.p95 <= WEB_TARGETS.saveP95Ms;
    return { load, frames, save, machine: await machineSize(), loadAverage, ok };
  } finally {
    server.close();
  }
}

const kb = (n: number) => `${(n / 1024).toFixed(1)} KB`;

export function printWebBench(r: WebBenchReport, log: (line: string) => void = console.log): void {
  log(`bench:web on ${r.machine}, load average at the start ${r.loadAverage}`);
  for (const f of r.load.files) log(`  ${f.file.padEnd(44)} ${kb(f.bytes).padStart(10)}  gzip ${kb(f.gzip).padStart(9)}`);
  log(
    `  first load, gzip: JS ${kb(r.load.jsGzip)} + CSS ${kb(r.load.cssGzip)} = ${kb(r.load.jsGzip + r.load.cssGzip)} (target ≤ ${WEB_TARGETS.firstLoadKb} KB)`,
  );
  const f = r.frames;
  log(
    `  board map, ${f.points} test points, pan + zoom for ${f.seconds.toFixed(1)} s: ${f.fps.toFixed(1)} fps (${f.frames} frames, p95 frame ${f.p95FrameMs.toFixed(1)} ms; target ≥ ${WEB_TARGETS.fps} fps)`,
  );
  log('  headless Chromium with --disable-gpu draws the canvas on the CPU');
  const s = r.save;
  log(
    `  reading saved → ranking updated on screen, ${s.saves} saves on the demo outdoor board: p50 ${s.p50.toFixed(0)} ms, p95 ${s.p95.toFixed(0)} ms, max ${s.max.toFixed(0)} ms (target p95 ≤ ${WEB_TARGETS.saveP95Ms} ms; after ${s.dictionaryWait.toFixed(0)} s waiting for the fault dictionary)`,
  );
  log(r.ok ? 'bench:web: targets met' : 'bench:web: targets MISSED');
}
