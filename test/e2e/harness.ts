/**
 * Shared by the e2e tests and bench/browser.ts: build the app with Vite into a
 * temp folder, serve it with `vite preview` on a free localhost port, and
 * launch Debian's Chromium headless with a fresh profile (playwright-core;
 * never a downloaded browser).
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer as netServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { build, preview, type PluginOption } from 'vite';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const ROOT = resolve(import.meta.dirname, '../..');
export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

function freePort(): Promise<number> {
  return new Promise((res, rej) => {
    const s = netServer();
    s.once('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const a = s.address();
      const port = typeof a === 'object' && a ? a.port : 0;
      s.close(() => res(port));
    });
  });
}

export interface Served {
  url: string;
  close(): Promise<void>;
}

export async function serveApp(plugins: PluginOption[] = []): Promise<Served> {
  const outDir = mkdtempSync(join(tmpdir(), 'atlas-dist-'));
  await build({ root: ROOT, configFile: join(ROOT, 'vite.config.ts'), logLevel: 'error', plugins, worker: { format: 'es', plugins: () => plugins }, build: { outDir, emptyOutDir: true, minify: !process.env.ATLAS_NO_MINIFY, sourcemap: !!process.env.ATLAS_NO_MINIFY } });
  const port = await freePort();
  const server = await preview({ root: ROOT, configFile: join(ROOT, 'vite.config.ts'), logLevel: 'error', build: { outDir }, preview: { host: '127.0.0.1', port, strictPort: true, open: false } });
  return {
    url: `http://127.0.0.1:${port}/`,
    async close() {
      await server.close();
      rmSync(outDir, { recursive: true, force: true });
    },
  };
}

export interface Browser {
  context: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

export async function launch(viewport = { width: 1600, height: 1000 }): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'atlas-profile-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    acceptDownloads: true,
    viewport,
    args: [
      '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync',
      // Software WebGL (SwiftShader) so the canvas renders without a GPU.
      '--use-angle=swiftshader', '--enable-unsafe-swiftshader',
      '--enable-precise-memory-info', '--js-flags=--expose-gc',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  return {
    context,
    page,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}

/** Wait until the worker's first scene and oval are in the store (and drawn). */
export async function waitForEngine(page: Page, timeoutMs = 120_000): Promise<void> {
  await page.waitForFunction(
    () => {
      const a = (window as unknown as { __atlas?: { store: { get(): { scene: unknown; oval: unknown; siteResults: unknown } } } }).__atlas;
      const s = a?.store.get();
      return !!(s && s.scene && s.oval && s.siteResults);
    },
    undefined,
    { timeout: timeoutMs, polling: 100 },
  );
}
