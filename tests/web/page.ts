/**
 * What the browser tests share: the designer built (production build, as `npm start` serves
 * it) and served on 127.0.0.1, a headless Chromium (./chromium.ts), and small readings of the
 * page. Screenshots for the docs are written only on demand — `LW_SCREENSHOTS=1` (or
 * `npm run screenshots`) — so a test run never changes a file of the repository.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Browser, BrowserContext, BrowserContextOptions, Download, Page } from 'playwright-core';
import { buildDesigner } from '../../src/web/browser.js';
import { serveStatic, type Served } from '../../src/web/serve.js';
import { launchChromium } from './chromium.js';

const SHOTS = fileURLToPath(new URL('../../docs/screenshots/', import.meta.url));

/** Screenshots are written into docs/screenshots/ only when asked for. */
export const SCREENSHOTS = process.env.LW_SCREENSHOTS === '1';

export interface Designer {
  readonly url: string;
  readonly browser: Browser;
  /** A fresh browser profile (its own storage) with these options. */
  context(options?: BrowserContextOptions): Promise<BrowserContext>;
  close(): Promise<void>;
}

export const DESKTOP: BrowserContextOptions = {
  viewport: { width: 1280, height: 800 },
  acceptDownloads: true,
  colorScheme: 'light',
};

/** A phone: 390 px wide, worked by touch. */
export const PHONE: BrowserContextOptions = {
  viewport: { width: 390, height: 844 },
  hasTouch: true,
  isMobile: true,
  deviceScaleFactor: 2,
  acceptDownloads: true,
  colorScheme: 'light',
};

/** Build the designer into a temporary folder, serve it and start Chromium. */
export async function startDesigner(): Promise<Designer> {
  const out = mkdtempSync(join(tmpdir(), 'latchwright-web-'));
  let server: Served | undefined;
  let browser: Browser | undefined;
  try {
    [browser] = await Promise.all([launchChromium(), buildDesigner(out)]);
    server = await serveStatic(out);
  } catch (e) {
    await browser?.close();
    rmSync(out, { recursive: true, force: true });
    throw e;
  }
  const b = browser;
  const s = server;
  return {
    url: s.url,
    browser: b,
    context: (options = DESKTOP) => b.newContext(options),
    close: async () => {
      await b.close();
      await s.close();
      rmSync(out, { recursive: true, force: true });
    },
  };
}

/** A page of the designer whose uncaught errors fail the test that caused them. */
export async function openPage(context: BrowserContext, url: string): Promise<Page> {
  const page = await context.newPage();
  page.on('pageerror', (e) => {
    throw e;
  });
  await page.goto(url);
  await settled(page);
  return page;
}

/** Wait until the latest text is read, built and checked (or refused with its problems shown). */
export async function settled(page: Page, timeout = 60_000): Promise<void> {
  await page.locator('lw-app .status[data-work="done"], lw-app .status[data-work="refused"]').waitFor({ timeout });
}

/** Wait until the latest text is built and every check has run. */
export async function built(page: Page, timeout = 60_000): Promise<void> {
  await page.locator('lw-app .status[data-work="done"]').waitFor({ timeout });
}

export async function shot(page: Page, name: string, fullPage = false): Promise<void> {
  if (SCREENSHOTS) await page.screenshot({ path: join(SHOTS, `${name}.png`), fullPage });
}

/** Click something that starts a download, and read the file that arrives. */
export async function downloaded(page: Page, click: () => Promise<void>): Promise<{ name: string; path: string }> {
  const [d]: [Download, void] = await Promise.all([page.waitForEvent('download'), click()]);
  return { name: d.suggestedFilename(), path: (await d.path()) ?? '' };
}

/**
 * Every element that sticks out of the window sideways, in the page and in every shadow root,
 * unless a box of its own that scrolls (or clips) holds it and that box itself fits. Empty
 * when nothing overflows.
 */
export function overflowing(page: Page): Promise<string[]> {
  return page.evaluate(() => {
    const width = document.documentElement.clientWidth;
    const out: string[] = [];
    const up = (e: Element): Element | null => {
      const root = e.getRootNode();
      return e.parentElement ?? (root instanceof ShadowRoot ? root.host : null);
    };
    const held = (el: Element): boolean => {
      for (let p = up(el); p; p = up(p)) {
        const ox = getComputedStyle(p).overflowX;
        const box = p.getBoundingClientRect();
        if (ox !== 'visible' && box.right <= width + 1 && box.left >= -1) return true;
      }
      return false;
    };
    const walk = (root: Document | ShadowRoot): void => {
      for (const el of root.querySelectorAll('*')) {
        const r = el.getBoundingClientRect();
        if (r.width > 0 && r.height > 0 && (r.right > width + 1 || r.left < -1) && !held(el))
          out.push(
            `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${String(el.getAttribute('class') ?? '')} ${Math.round(r.left)}–${Math.round(r.right)}`,
          );
        if (el.shadowRoot) walk(el.shadowRoot);
      }
    };
    walk(document);
    if (document.documentElement.scrollWidth > width + 1)
      out.push(`the page: ${document.documentElement.scrollWidth} px wide`);
    return out;
  });
}

/** The caret's line (1-based) and the selected text of the editor. */
export function caret(page: Page): Promise<{ line: number; selected: string }> {
  return page.locator('lw-editor textarea').evaluate((t: HTMLTextAreaElement) => ({
    line: t.value.slice(0, t.selectionStart).split('\n').length,
    selected: t.value.slice(t.selectionStart, t.selectionEnd),
  }));
}

/** The page's own account of its latest job, draft, build and checks (data attributes on lw-app), and its status. */
export interface PageWork {
  readonly job: number;
  readonly built: number;
  readonly draft: number;
  readonly checked: number;
  readonly codes: string;
  readonly searches: number;
  readonly work: string;
}

export function pageWork(page: Page): Promise<PageWork> {
  return page.evaluate(() => {
    const app = document.querySelector('lw-app') as HTMLElement;
    const d = app.dataset;
    return {
      job: Number(d.job),
      built: Number(d.built),
      draft: Number(d.draft),
      checked: Number(d.checked),
      codes: d.codes ?? '',
      searches: Number(d.searches),
      work: app.shadowRoot?.querySelector('.status')?.getAttribute('data-work') ?? '',
    };
  });
}
