// Browser-test and benchmark harness: build the workbench into a temporary directory, serve it from a
// nested path on a free localhost port (so the relative base is exercised), and drive Debian's
// chromium through playwright-core with a fresh profile. Never downloads a browser.

import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

export const ROOT = resolve(import.meta.dirname, '../..');
export const CHROMIUM = '/usr/bin/chromium';
export const CHROMIUM_FLAGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
];
/** The app is served below this path, to prove the static build works away from the site root. */
export const MOUNT = '/labs/rf/slabecho/';

/** Fail with a clear message when Debian's chromium is missing (loudly in CI). */
export function requireChromium(): void {
  if (existsSync(CHROMIUM)) return;
  const how = 'install it with: apt-get update && apt-get install -y --no-install-recommends chromium';
  if (process.env.CI === 'true') throw new Error(`CI: ${CHROMIUM} is missing; .ci/run should have installed it (${how})`);
  throw new Error(`The browser tests drive Debian's chromium at ${CHROMIUM}, which is missing; ${how}`);
}

/** `vite build` into a fresh temporary directory; returns it. */
export async function buildApp(): Promise<string> {
  const out = mkdtempSync(join(tmpdir(), 'slabecho-dist-'));
  const vite = join(ROOT, 'node_modules', 'vite', 'bin', 'vite.js');
  await new Promise<void>((ok, fail) => {
    const p = spawn(process.execPath, [vite, 'build', '--outDir', out, '--emptyOutDir', '--logLevel', 'warn'], { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
    let log = '';
    p.stdout.on('data', (d: Buffer) => { log += d.toString(); });
    p.stderr.on('data', (d: Buffer) => { log += d.toString(); });
    p.on('error', fail);
    p.on('exit', (code) => (code === 0 ? ok() : fail(new Error(`vite build failed (exit ${code}):\n${log}`))));
  });
  return out;
}

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8', '.css': 'text/css; charset=utf-8',
  '.svg': 'image/svg+xml', '.json': 'application/json', '.png': 'image/png', '.wasm': 'application/wasm',
};

export interface StaticSite {
  url: string;
  /** Every request path and the status it got. */
  log: Array<{ path: string; status: number }>;
  close(): Promise<void>;
}

/** Serve `dir` at MOUNT on 127.0.0.1 (a free port). Anything outside MOUNT is a 404. */
export async function serveStatic(dir: string): Promise<StaticSite> {
  const log: StaticSite['log'] = [];
  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    let status = 404, body: Buffer | string = 'not found', type = 'text/plain';
    if (path.startsWith(MOUNT)) {
      const rel = path.slice(MOUNT.length) || 'index.html';
      const file = normalize(join(dir, rel));
      if (file.startsWith(dir) && existsSync(file) && statSync(file).isFile()) {
        status = 200; body = readFileSync(file); type = TYPES[extname(file)] ?? 'application/octet-stream';
      }
    }
    log.push({ path, status });
    res.writeHead(status, { 'content-type': type, 'cache-control': 'no-store' });
    res.end(body);
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const addr = server.address();
  if (addr === null || typeof addr === 'string') throw new Error('no port');
  return {
    url: `http://127.0.0.1:${addr.port}${MOUNT}`,
    log,
    close: () => new Promise<void>((ok) => server.close(() => ok())),
  };
}

export interface Browser {
  context: BrowserContext;
  profile: string;
  close(): Promise<void>;
}

/** Chromium with a fresh user-data directory; downloads accepted. */
export async function launch(viewport = { width: 1440, height: 1200 }): Promise<Browser> {
  requireChromium();
  const profile = mkdtempSync(join(tmpdir(), 'slabecho-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    args: CHROMIUM_FLAGS,
    headless: true,
    viewport,
    acceptDownloads: true,
  });
  return {
    context,
    profile,
    close: async () => { await context.close(); rmSync(profile, { recursive: true, force: true }); },
  };
}

export const removeDir = (dir: string): void => rmSync(dir, { recursive: true, force: true });
