/**
 * The designer's configurator in Chromium: a designer signs in, opens every template, moves the entry-hole slider and
 * sees the preview and the figures change, saves a preset, reloads it, and downloads an STL that the test checks
 * with manifold-3d (closed, manifold) and against the server's export of the same parameters (same mesh hash, same
 * bytes). Screenshots go to /tmp/nestwright-e2e for a person to look at.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import Module from 'manifold-3d';
import { TEMPLATES, describeParameters } from '../../templates/index';
import { generate } from '../../templates/generate';
import { liveLimits } from '../../templates/lib/liveLimits';
import { parseStl } from '../../shared/mesh/parseStl';
import { parse3mf } from '../../shared/mesh/parse3mf';
import sharp from 'sharp';
import { PALETTE } from '../../src/styles/palette';
import { pickMenuEntry, startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 900 } });
}, 240_000);

afterAll(async () => {
  await e2e?.close();
});

/**
 * Share of an image's pixels that differ clearly from the 3D stage's background (the model, the plate and its lines
 * drawn on it); an empty or undrawn canvas gives 0.
 * @param png - a PNG image
 */
async function drawnShare(png: Buffer): Promise<number> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const ground = [1, 3, 5].map((at) => parseInt(PALETTE.stage.slice(at, at + 2), 16));
  let drawn = 0;
  for (let i = 0; i < data.length; i += 3) {
    const off = Math.abs(data[i] - ground[0]) + Math.abs(data[i + 1] - ground[1]) + Math.abs(data[i + 2] - ground[2]);
    if (off > 24) drawn++;
  }
  return drawn / (info.width * info.height);
}

/** Waits until the editor shows a built mesh whose hash differs from `previous` and returns that hash. */
async function waitForBuild(page: Page, previous = '…'): Promise<string> {
  const hash = page.getByTestId('mesh-hash');
  await page.waitForFunction(
    (old) => {
      const text = document.querySelector('[data-testid="mesh-hash"]')?.textContent?.trim();
      const busy = document.querySelector('[data-testid="geometry-status"]')?.textContent?.includes('Rebuilding');
      return !!text && text !== '…' && text !== old && !busy;
    },
    previous,
    { timeout: 60_000 },
  );
  return (await hash.textContent())!.trim();
}

async function figure(page: Page, id: string): Promise<string> {
  return ((await page.getByTestId(`figure-${id}`).locator('dd').textContent()) ?? '').trim();
}

/** Clicks the entry-hole slider's rail at a fraction of its length, as a person dragging it would. */
async function moveEntrySlider(page: Page, fraction: number): Promise<void> {
  const rail = page.getByTestId('param-entryHoleDiameterMm').locator('.n-slider-rail');
  const box = await rail.boundingBox();
  if (!box) throw new Error('entry-hole slider is not visible');
  await page.mouse.click(box.x + box.width * fraction, box.y + box.height / 2);
}

async function entryInputValue(page: Page): Promise<number> {
  return Number(await page.locator('#input-entryHoleDiameterMm').inputValue());
}

describe('designer configurator', () => {
  it('lists every registered template on the designs screen', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto('/designs');
    for (const template of TEMPLATES) {
      await expect(page.getByTestId(`template-${template.id}`).textContent()).resolves.toContain(template.name);
    }
    await page.screenshot({ path: `${SHOTS}/designs.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it.each(TEMPLATES.map((template) => [template.id]))(
    'opens %s, and moving the entry-hole slider changes the preview and the figures',
    async (templateId: string) => {
      const template = TEMPLATES.find((item) => item.id === templateId)!;
      const entry = describeParameters(template).find((param) => param.key === 'entryHoleDiameterMm');
      expect(entry, `${templateId} offers an entry-hole parameter`).toBeDefined();
      const page = await e2e.newPage();
      await e2e.signInAs(page, 'designer');
      await page.goto('/designs');
      await page.getByTestId(`template-${templateId}`).click();
      await page.waitForURL(`**/designs/new/${templateId}`);

      const firstHash = await waitForBuild(page);
      expect(await page.getByTestId('model-canvas').count()).toBe(1);
      // The preview is drawn by a worker (the page's canvas was handed over, so the page cannot draw on it), and what
      // the worker drew is on screen: the model and the plate cover a good part of the stage.
      const handedOver = await page.getByTestId('model-canvas').evaluate((canvas: HTMLCanvasElement) => {
        try {
          canvas.getContext('2d');
          return false;
        } catch {
          return true;
        }
      });
      expect(handedOver).toBe(true);
      await expect
        .poll(async () => drawnShare(await page.getByTestId('model-canvas').screenshot()))
        .toBeGreaterThan(0.1);
      expect(await entryInputValue(page)).toBeCloseTo(Number(entry!.default), 6);
      const volumeBefore = await figure(page, 'volume');
      const massBefore = await figure(page, 'mass');
      expect(volumeBefore).toMatch(/cm³$/);

      // 40 % along the rail (about 39 mm): an entry every template fits under its roof at the default hole height
      // (the round pod allows up to 40.5 mm there; a larger entry needs a lower hole or a taller body, which
      // parseParams says by name).
      await moveEntrySlider(page, 0.4);
      const secondHash = await waitForBuild(page, firstHash);
      const moved = await entryInputValue(page);
      // The slider moved up from the 32 mm default: 40 % along the rail, within a step or two.
      // The rail spans the live range (what the other values at their defaults allow), not the schema's range.
      const live = liveLimits(template, {}).entryHoleDiameterMm;
      const expected = live.min + 0.4 * (live.max - live.min);
      expect(Math.abs(moved - expected)).toBeLessThan((entry!.max! - entry!.min!) * 0.05);
      expect(secondHash).not.toBe(firstHash);
      // A bigger hole removes material: the volume figure changes (mass follows it).
      expect(await figure(page, 'volume')).not.toBe(volumeBefore);
      expect(await figure(page, 'mass')).not.toBe(massBefore);
      // The figure panel shows the box dimensions the bird-fit rules read.
      expect(await page.getByTestId('bird-fit').textContent()).toContain(`${moved.toFixed(1)} mm`);

      // Switching the perch on shows why guidance advises against it.
      // source: USFWS "For the Birds" and Cornell NestWatch — no perch on a nest box
      if (describeParameters(template).some((param) => param.key === 'perch')) {
        expect(await page.getByTestId('bird-warnings').textContent()).not.toMatch(/perch/i);
        await page.getByTestId('param-perch').locator('.n-switch').click();
        await waitForBuild(page, secondHash);
        expect(await page.getByTestId('bird-warnings').textContent()).toMatch(/perch/i);
      }

      await page.screenshot({ path: `${SHOTS}/editor-${templateId}.png` });
      expect(e2e.problems(page)).toEqual([]);
      await page.context().close();
    },
    120_000,
  );

  it('draws on the page itself where a canvas cannot be handed to a worker, and still follows the slider', async () => {
    const page = await e2e.newPage();
    // As in a browser without OffscreenCanvas for WebGL: the page's canvas offers no way to hand it over.
    await page.addInitScript(() => {
      delete (HTMLCanvasElement.prototype as Partial<HTMLCanvasElement>).transferControlToOffscreen;
    });
    await e2e.signInAs(page, 'designer');
    await page.goto('/designs/new/gable-box');
    const firstHash = await waitForBuild(page);
    // The page kept its canvas (a handed-over canvas refuses a context; this one gives its WebGL context back).
    const kept = await page
      .getByTestId('model-canvas')
      .evaluate(
        (canvas: HTMLCanvasElement) => canvas.getContext('webgl2') !== null || canvas.getContext('webgl') !== null,
      );
    expect(kept).toBe(true);
    await expect.poll(async () => drawnShare(await page.getByTestId('model-canvas').screenshot())).toBeGreaterThan(0.1);
    const before = await page.getByTestId('model-canvas').screenshot();
    await moveEntrySlider(page, 0.6);
    await waitForBuild(page, firstHash);
    // The new mesh is drawn: the stage's pixels change.
    await expect.poll(async () => (await page.getByTestId('model-canvas').screenshot()).equals(before)).toBe(false);
    await page.screenshot({ path: `${SHOTS}/editor-page-stage.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 120_000);

  it('renames and deletes a preset from the designs screen, with a confirmation', async () => {
    const template = TEMPLATES[0];
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    const created = await page.request.post('/api/presets', {
      data: { templateId: template.id, name: 'Card to rename', params: {} },
      headers: { Origin: e2e.baseUrl },
    });
    expect(created.status()).toBe(201);
    const id = ((await created.json()) as { id: string }).id;
    await page.goto('/designs');
    const card = page.getByTestId(`preset-card-${id}`);
    await expect(card.textContent()).resolves.toContain('Card to rename');

    await pickMenuEntry(page, card.getByRole('button', { name: 'More actions for Card to rename' }), 'Rename…');
    await page.getByLabel('Preset name').fill('Card renamed');
    await page.getByRole('button', { name: 'Rename', exact: true }).click();
    await page.getByText('Renamed to “Card renamed”.').waitFor();
    await expect(card.textContent()).resolves.toContain('Card renamed');

    await pickMenuEntry(page, card.getByRole('button', { name: 'More actions for Card renamed' }), 'Delete…');
    await page.getByRole('button', { name: 'Delete', exact: true }).click();
    await page.getByText('Deleted “Card renamed”.').waitFor();
    expect(await card.count()).toBe(0);
    expect((await page.request.get(`/api/presets/${id}`)).status()).toBe(404);
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it('saves a preset, reloads it, and downloads an STL that is manifold and identical to the server export', async () => {
    const template = TEMPLATES[0];
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto(`/designs/new/${template.id}`);
    const firstHash = await waitForBuild(page);
    await moveEntrySlider(page, 0.2);
    const hash = await waitForBuild(page, firstHash);
    const entryMm = await entryInputValue(page);

    // Save as a named preset: the URL becomes the preset's.
    await page.getByTestId('save-preset').click();
    await page.locator('#preset-name').fill('Browser test, small entry');
    await page.getByTestId('confirm-preset-name').click();
    await page.waitForURL(/\/designs\/[0-9a-f-]{36}$/);
    const presetId = new URL(page.url()).pathname.split('/').pop()!;
    await expect(page.getByTestId('design-title').textContent()).resolves.toContain('Browser test, small entry');

    // Reload the page: the preset's parameters come back from the server and build the same mesh.
    await page.reload();
    const reloadedHash = await waitForBuild(page);
    expect(reloadedHash).toBe(hash);
    expect(await entryInputValue(page)).toBeCloseTo(entryMm, 6);
    expect(await page.getByTestId('unsaved').count()).toBe(0);
    await page.screenshot({ path: `${SHOTS}/editor-preset.png` });

    // Inches only at the edge of the UI: switching the display converts the shown value and builds nothing new.
    await page.getByText('inch', { exact: true }).click();
    await page.waitForFunction(() =>
      document.querySelector('#input-entryHoleDiameterMm')?.closest('[data-testid]')?.textContent?.includes(' in'),
    );
    // source: 1 in = 25.4 mm exactly (international inch, 1959)
    expect(await entryInputValue(page)).toBeCloseTo(entryMm / 25.4, 2);
    expect((await page.getByTestId('mesh-hash').textContent())!.trim()).toBe(hash);
    await page.screenshot({ path: `${SHOTS}/editor-inch.png` });
    await page.getByText('mm', { exact: true }).first().click();
    expect(await page.getByTestId('unsaved').count()).toBe(0);

    // The designs screen lists it with the thumbnail rendered on save.
    const stored = await page.request.get(`/api/presets/${presetId}`);
    expect(stored.status()).toBe(200);
    const preset = (await stored.json()) as { params: Record<string, unknown>; thumbnail: string | null };
    expect(preset.thumbnail).toMatch(/^data:image\/png;base64,/);
    // The thumbnail shows the model, not an empty stage (it is drawn by the viewer's worker and read back there).
    const thumbnailPng = Buffer.from(preset.thumbnail!.slice('data:image/png;base64,'.length), 'base64');
    expect(await drawnShare(thumbnailPng)).toBeGreaterThan(0.1);
    expect(preset.params.entryHoleDiameterMm).toBeCloseTo(entryMm, 6);

    // Download the STL written in the browser.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-stl').click()]);
    const stlPath = `${SHOTS}/browser-${presetId}.stl`;
    await download.saveAs(stlPath);
    const browserStl = new Uint8Array(readFileSync(stlPath));
    // Binary STL size is 84 + 50 × triangles (source: Paul Bourke, "STL format", 1999).
    const triangles = new DataView(browserStl.buffer, browserStl.byteOffset).getUint32(80, true);
    expect(browserStl.length).toBe(84 + 50 * triangles);

    // manifold-3d (outside the project) accepts it as one closed, oriented 2-manifold per body.
    const wasm = await Module();
    wasm.setup();
    const mesh = parseStl(browserStl);
    const manifold = new wasm.Manifold(
      new wasm.Mesh({ numProp: 3, vertProperties: mesh.positions, triVerts: mesh.indices }),
    );
    expect(manifold.status()).toBe('NoError');
    expect(manifold.numTri()).toBe(triangles);
    const node = await generate(template.id, preset.params);
    // Volume agrees with the mesh the template builds in Node (tolerance: float32 STL coordinates).
    expect(Math.abs(manifold.volume() - node.volumeMm3) / node.volumeMm3).toBeLessThan(1e-4);
    manifold.delete();

    // The 3MF written in the browser is a ZIP package (3MF core spec: OPC container) holding the same triangles.
    const [download3mf] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-3mf').click()]);
    const threeMfPath = `${SHOTS}/browser-${presetId}.3mf`;
    await download3mf.saveAs(threeMfPath);
    const threeMf = new Uint8Array(readFileSync(threeMfPath));
    expect(String.fromCharCode(threeMf[0], threeMf[1])).toBe('PK'); // source: PKWARE APPNOTE, local file header
    expect(parse3mf(threeMf).indices.length / 3).toBe(triangles);

    // The server export of the same parameters is the same mesh: its hash is the one the page shows, and the file
    // bytes are identical.
    const exported = await page.request.post('/api/exports', {
      data: { templateId: template.id, params: preset.params, format: 'stl' },
      headers: { Origin: e2e.baseUrl },
    });
    expect(exported.status(), await exported.text()).toBe(200);
    const serverSha = exported.headers()['x-mesh-sha256'];
    expect(serverSha).toMatch(/^[0-9a-f]{64}$/);
    expect(serverSha.slice(0, 12)).toBe(hash);
    expect(node.sha256).toBe(serverSha);
    const serverStl = new Uint8Array(await exported.body());
    const digest = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
    expect(digest(browserStl)).toBe(digest(serverStl));

    // The page's own "from server" button shows the server's hash beside the preview's, marked as the same mesh.
    const [serverDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByTestId('export-server-stl').click(),
    ]);
    expect(serverDownload.suggestedFilename()).toMatch(/\.stl$/);
    await page.getByTestId('server-hash').waitFor();
    expect((await page.getByTestId('server-hash').textContent())!.trim()).toBe(hash);
    await expect(page.getByTestId('hash-match').textContent()).resolves.toContain('same mesh');
    await page.screenshot({ path: `${SHOTS}/editor-export.png` });

    // Change the design again and save the changes into the same preset.
    await moveEntrySlider(page, 0.4);
    const changedHash = await waitForBuild(page, hash);
    const changedMm = await entryInputValue(page);
    await page.getByTestId('unsaved').waitFor();
    await page.getByTestId('save-preset').click();
    await page.getByText('Saved “Browser test, small entry”.').waitFor();
    expect(await page.getByTestId('unsaved').count()).toBe(0);
    const updated = (await (await page.request.get(`/api/presets/${presetId}`)).json()) as {
      params: Record<string, number>;
    };
    expect(updated.params.entryHoleDiameterMm).toBeCloseTo(changedMm, 6);
    expect(changedHash).not.toBe(hash);

    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 180_000);
});

describe('outdoor fitness in the editor', () => {
  it('a black PLA box fails the roof sun check with the heat caution; a white one passes', async () => {
    const template = TEMPLATES[0];
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto(`/designs/new/${template.id}`);
    await waitForBuild(page);
    await page.getByTestId('material-select').click();
    await page.locator('.n-base-select-option', { hasText: /^PLA$/ }).click();
    expect(await figure(page, 'mass')).toMatch(/g$/);
    expect(await page.getByTestId('figure-mass').locator('dt').textContent()).toContain('PLA');

    /** Chooses a colour swatch and waits until the outdoor roof verdict is for that colour. */
    async function chooseColour(colourId: string, verdict: 'ok' | 'fail'): Promise<void> {
      await page.getByTestId(`colour-${colourId}`).click();
      await page.waitForSelector(`[data-testid="outdoor-roof"][data-verdict="${verdict}"]`, { timeout: 60_000 });
    }

    // source: sol-air, black absorptance 0.95 (scirp.org absorptance table), PLA HDT 55 °C (NatureWorks Ingeo 2003D):
    // 30 + 0.95·1000/17 − 3.9 ≈ 82 °C on the roof, well above 55 °C.
    await chooseColour('black', 'fail');
    expect(await page.getByTestId('outdoor-verdict').textContent()).toMatch(/fails/);
    const cautions = (await page.getByTestId('outdoor-cautions').textContent()) ?? '';
    expect(cautions).toMatch(/roof can reach about 8\d\.\d °C, above the PLA heat-deflection/);
    expect(cautions).toMatch(/light colours/);
    expect(cautions).toMatch(/local rules/);
    await page.getByTestId('outdoors').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${SHOTS}/outdoor-black.png` });

    // source: white enamel 0.252: 30 + 0.25·1000/17 − 3.9 ≈ 41 °C, 14 K below 55 °C.
    await chooseColour('white', 'ok');
    expect(await page.getByTestId('outdoor-verdict').textContent()).toMatch(/passes/);
    expect(await page.getByTestId('outdoor-cautions').textContent()).not.toMatch(/above the PLA heat-deflection/);
    expect(await page.getByTestId('outdoor-insulation').textContent()).toMatch(/Pine board/);
    await page.screenshot({ path: `${SHOTS}/outdoor-white.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  }, 180_000);
});
