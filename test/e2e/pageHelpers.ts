/** Page-side helpers for the e2e tests and the browser benchmark (they read window.__atlas). */
import type { Page } from 'playwright-core';
import { launch, serveApp, waitForEngine, type Browser, type Served } from './harness';

type Ch = 'scene' | 'oval' | 'sites' | 'sweep';

/** Wait until the named channels have answers computed for the page's current inputs. */
export async function waitFresh(page: Page, channels: Ch[] = ['scene', 'oval', 'sites'], timeoutMs = 120_000): Promise<void> {
  await page.waitForFunction(
    (chs) => {
      const a = (window as unknown as { __atlas?: { store: { get(): Record<string, unknown> } } }).__atlas;
      if (!a) return false;
      const s = a.store.get() as { conditions: unknown; products: unknown; sites: unknown; answeredFor: Record<string, { conditions: unknown; products: unknown; sites: unknown } | undefined> };
      return chs.every((c) => {
        const f = s.answeredFor[c];
        if (!f || f.conditions !== s.conditions) return false;
        if (c !== 'scene' && f.products !== s.products) return false;
        return c !== 'sites' || f.sites === s.sites;
      });
    },
    channels,
    { timeout: timeoutMs, polling: 50 },
  );
}

/** Type a value into the number field with this exact label. */
export async function setNumber(page: Page, label: string, value: number): Promise<void> {
  await page.getByLabel(label, { exact: true }).fill(String(value));
}

/** Click an export button and return the downloaded text. */
export async function downloadText(page: Page, button: string): Promise<{ name: string; text: string }> {
  const [dl] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: button, exact: true }).click()]);
  const stream = await dl.createReadStream();
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return { name: dl.suggestedFilename(), text: Buffer.concat(chunks).toString('utf8') };
}

/**
 * Build and serve the app, launch the browser, let `before` attach its listeners (page
 * errors, requests, dialogs), open the page at `query` and wait until the engine has
 * answered the channels for the page's inputs.
 */
export async function openApp(opts: { query?: string; channels?: Ch[]; before?: (b: Browser, served: Served) => void } = {}): Promise<{ served: Served; b: Browser }> {
  const served = await serveApp();
  const b = await launch();
  opts.before?.(b, served);
  await b.page.goto(opts.query ? `${served.url}?${opts.query}` : served.url);
  await waitForEngine(b.page);
  await waitFresh(b.page, opts.channels);
  return { served, b };
}
