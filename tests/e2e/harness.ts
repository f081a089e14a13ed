/**
 * Browser-test harness shared by every `tests/e2e/*.e2e.test.ts`: builds the client once for the current state of its
 * sources, boots the real server on a free port with a new seeded in-memory database, and drives Debian's Chromium
 * through playwright-core. Each page gets its own browser context (its own cookies).
 *
 * The client is built into `dist/e2e/<newest source mtime>/`, not dist/client: several people run browser tests and
 * `npm start` in one tree at once, and a rebuild of a shared folder (vite empties it first) would pull the assets
 * from under a server another run is still testing against.
 *
 * ```ts
 * let e2e: E2E;
 * beforeAll(async () => { e2e = await startE2E(); });
 * afterAll(() => e2e?.close());
 * it('...', async () => { const page = await e2e.newPage(); await e2e.signInAs(page, 'designer'); ... });
 * ```
 */
import { existsSync, mkdirSync, readdirSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  chromium,
  type Browser,
  type BrowserContext,
  type BrowserContextOptions,
  type Locator,
  type Page,
} from 'playwright-core';
import type { Role } from '../../shared/schemas/auth';
import { boot, type Booted } from '../../server/boot';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../server/db/seedDemo';

/** Repository root. */
const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
/** Builds of the client for browser tests, one folder per state of the sources. */
export const E2E_BUILDS_DIR = join(ROOT, 'dist/e2e');
/** Everything that goes into the client bundle; a newer file here needs a new build. */
const CLIENT_SOURCES = ['src', 'shared', 'templates', 'public', 'index.html', 'vite.config.ts', 'package-lock.json'];
/** Lock so that e2e files running in parallel (in one run or in several) build one state only once. */
const BUILD_LOCK = join(E2E_BUILDS_DIR, '.build.lock');
/** A lock older than this is left over from a crashed run (a build takes 30-60 s on a busy 2-core machine). */
const STALE_LOCK_MS = 5 * 60_000;
/** Builds older than this are removed when a new one is made (no test run lasts that long). */
const OLD_BUILD_MS = 2 * 60 * 60_000;

/** Chromium flags for headless runs on a shared CI machine (common.md). */
export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--no-first-run',
];

/** Debian's Chromium; never a downloaded browser. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** A running server and browser for one e2e test file. */
export interface E2E {
  /** `http://localhost:<port>` of the server under test. */
  baseUrl: string;
  /** The booted server (its `ctx.db` lets a test look at or prepare data). */
  server: Booted;
  /** The shared browser. */
  browser: Browser;
  /**
   * A new page in a fresh browser context (no cookies), 1280x800 unless told otherwise.
   * Console errors and failed requests of the page are collected in `problems(page)`.
   * @param options - playwright context options (viewport, locale, ...)
   */
  newPage(options?: BrowserContextOptions): Promise<Page>;
  /**
   * Signs in through the sign-in page and waits until the app has left it.
   * @param page - the page
   * @param email - e-mail address
   * @param password - password
   */
  signIn(page: Page, email: string, password: string): Promise<void>;
  /**
   * Signs in as the seeded demo person holding `role` (password from the seed).
   * @param page - the page
   * @param role - one of the four roles
   * @returns the demo person
   */
  signInAs(page: Page, role: Role): Promise<DemoPerson>;
  /**
   * Uncaught page errors and console errors seen on the page so far (tests assert it is empty).
   * @param page - a page from {@link E2E.newPage}
   */
  problems(page: Page): string[];
  /** Closes every context, the browser and the server. */
  close(): Promise<void>;
}

/** A seeded demo person. */
export interface DemoPerson {
  email: string;
  name: string;
  roles: Role[];
  password: string;
}

/**
 * The seeded demo person holding `role`.
 * @param role - one of the four roles
 */
export function demoPerson(role: Role): DemoPerson {
  const person = DEMO_PEOPLE.find((p) => p.roles.includes(role));
  if (!person) throw new Error(`No demo person holds the role ${role}`);
  return { ...person, roles: [...person.roles], password: DEMO_PASSWORD };
}

/**
 * Opens a drop-down menu and picks an entry. The menu scales in from its button: the entry is clicked once the menu
 * stands still, not while it grows under the pointer (on a busy machine the entry next to it can be there then).
 * @param page - the page
 * @param opener - the button that opens the menu
 * @param entry - the entry's exact text
 */
export async function pickMenuEntry(page: Page, opener: Locator, entry: string): Promise<void> {
  await opener.click();
  const item = page.locator('.n-dropdown-menu').getByText(entry, { exact: true });
  await item.waitFor();
  await page.waitForFunction(() =>
    [...document.querySelectorAll('.n-dropdown-menu')].every(
      (menu) => menu.getAnimations({ subtree: true }).length === 0,
    ),
  );
  await item.click();
}

/** Options of {@link startE2E}. */
export interface StartE2EOptions {
  /** DATA_DIR for the server; undefined = a new in-memory database. */
  dataDir?: string;
  /** Default viewport of new pages. */
  viewport?: { width: number; height: number };
  /** Log server stages and browser console messages to stdout. */
  verbose?: boolean;
}

/**
 * Builds the client if needed, boots the server (in-memory, seeded, port 0) and launches Chromium.
 * @param options - see {@link StartE2EOptions}
 */
export async function startE2E(options: StartE2EOptions = {}): Promise<E2E> {
  const clientDir = await ensureClientBuilt();
  const log = options.verbose ? (line: string) => console.log(`[server] ${line}`) : () => {};
  const server = await boot({ port: 0, seed: true, dataDir: options.dataDir, clientDir, log });
  let browser: Browser;
  try {
    browser = await chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
  } catch (err) {
    await server.close();
    throw err;
  }
  const contexts = new Set<BrowserContext>();
  const pageProblems = new WeakMap<Page, string[]>();
  const baseUrl = server.url;

  const e2e: E2E = {
    baseUrl,
    server,
    browser,
    async newPage(contextOptions = {}) {
      const context = await browser.newContext({
        baseURL: baseUrl,
        viewport: options.viewport ?? { width: 1280, height: 800 },
        ...contextOptions,
      });
      contexts.add(context);
      context.on('close', () => contexts.delete(context));
      const page = await context.newPage();
      // Fail a step with its own message before the test's timeout does (generous: the machine is shared).
      page.setDefaultTimeout(15_000);
      const problems: string[] = [];
      pageProblems.set(page, problems);
      page.on('pageerror', (err) => problems.push(`page error: ${err.message}`));
      page.on('console', (msg) => {
        if (options.verbose) console.log(`[browser ${msg.type()}] ${msg.text()}`);
        // Expected 401/403/429 answers show up as console errors of the failed fetch; keep only script errors.
        if (msg.type() === 'error' && !/Failed to load resource/.test(msg.text()))
          problems.push(`console: ${msg.text()}`);
      });
      return page;
    },
    async signIn(page, email, password) {
      await page.goto('/sign-in');
      await page.getByLabel('E-mail').fill(email);
      await page.getByLabel('Password', { exact: true }).fill(password);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL((url) => url.pathname !== '/sign-in', { timeout: 15_000 });
    },
    async signInAs(page, role) {
      const person = demoPerson(role);
      await e2e.signIn(page, person.email, person.password);
      return person;
    },
    problems(page) {
      return [...(pageProblems.get(page) ?? [])];
    },
    async close() {
      for (const context of [...contexts]) await context.close().catch(() => {});
      await browser.close().catch(() => {});
      await server.close();
    },
  };
  return e2e;
}

/**
 * Builds the client for the current state of its sources unless that build exists, once even when several e2e files
 * start at the same time (a lock directory serialises them), and removes builds older than two hours.
 * @returns the folder to serve (holds index.html and assets/)
 */
export async function ensureClientBuilt(): Promise<string> {
  const dir = join(E2E_BUILDS_DIR, String(Math.floor(newestMtimeMs(CLIENT_SOURCES.map((p) => join(ROOT, p))))));
  if (existsSync(join(dir, 'index.html'))) return dir;
  await acquireLock();
  try {
    if (existsSync(join(dir, 'index.html'))) return dir; // another run built it while we waited
    const staging = `${dir}.building-${process.pid}`;
    const { build } = await import('vite');
    // vitest sets NODE_ENV=test, which would give a development build of Vue; build as `npm run build` does.
    const nodeEnv = process.env.NODE_ENV;
    process.env.NODE_ENV = 'production';
    try {
      await build({
        root: ROOT,
        configFile: join(ROOT, 'vite.config.ts'),
        logLevel: 'warn',
        mode: 'production',
        build: { outDir: staging, emptyOutDir: true },
      });
    } catch (err) {
      rmSync(staging, { recursive: true, force: true });
      throw err;
    } finally {
      // Assigning undefined would store the string "undefined" (and the server refuses to start with it).
      if (nodeEnv === undefined) delete process.env.NODE_ENV;
      else process.env.NODE_ENV = nodeEnv;
    }
    renameSync(staging, dir); // appears whole or not at all
    pruneOldBuilds(dir);
    return dir;
  } finally {
    rmSync(BUILD_LOCK, { recursive: true, force: true });
  }
}

function pruneOldBuilds(keep: string): void {
  for (const entry of readdirSync(E2E_BUILDS_DIR)) {
    const path = join(E2E_BUILDS_DIR, entry);
    if (path === keep || path === BUILD_LOCK) continue;
    const stat = statSync(path, { throwIfNoEntry: false });
    if (stat?.isDirectory() && Date.now() - stat.mtimeMs > OLD_BUILD_MS) rmSync(path, { recursive: true, force: true });
  }
}

function newestMtimeMs(paths: string[]): number {
  let newest = 0;
  const visit = (path: string): void => {
    const stat = statSync(path, { throwIfNoEntry: false }); // files come and go while others work in the tree
    if (!stat) return;
    if (stat.isDirectory()) {
      for (const entry of readdirSync(path)) if (entry !== 'node_modules') visit(join(path, entry));
    } else newest = Math.max(newest, stat.mtimeMs);
  };
  paths.forEach(visit);
  return newest;
}

async function acquireLock(): Promise<void> {
  mkdirSync(dirname(BUILD_LOCK), { recursive: true });
  for (;;) {
    try {
      mkdirSync(BUILD_LOCK);
      return;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      const lock = statSync(BUILD_LOCK, { throwIfNoEntry: false });
      if (lock && Date.now() - lock.mtimeMs > STALE_LOCK_MS) rmSync(BUILD_LOCK, { recursive: true, force: true });
      else await new Promise((r) => setTimeout(r, 250));
    }
  }
}
