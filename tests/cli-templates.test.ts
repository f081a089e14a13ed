/**
 * The CLI commands `templates --json` and `export`, run as a real process through `npm run cli`; the exported file
 * is checked with Debian's admesh.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const run = promisify(execFile);
let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'nw-cli-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function cli(args: string[]): Promise<{ stdout: string; stderr: string }> {
  return run('npx', ['tsx', 'server/cli/index.ts', ...args], { cwd: process.cwd(), timeout: 60_000 });
}

describe('npm run cli -- templates --json', () => {
  it('prints every template with key, unit, min, max, step and default per parameter', async () => {
    const { stdout } = await cli(['templates', '--json']);
    const { templates } = JSON.parse(stdout) as {
      templates: { id: string; version: number; name: string; parameters: Record<string, unknown>[] }[];
    };
    expect(templates.map((t) => t.id)).toEqual(['gable-box', 'a-frame', 'round-pod', 'bark-trunk']);
    for (const template of templates) {
      expect(template.version).toBeGreaterThanOrEqual(1);
      for (const p of template.parameters) {
        expect(p).toHaveProperty('key');
        expect(p).toHaveProperty('unit');
        expect(p).toHaveProperty('default');
        if (p.kind === 'number') {
          expect(p.min).toBeTypeOf('number');
          expect(p.max).toBeTypeOf('number');
          expect(p.step).toBeTypeOf('number');
        }
      }
    }
  }, 90_000);
});

describe('npm run cli -- export', () => {
  it('writes an STL that admesh reads as closed, and prints triangles, volume and hash', async () => {
    const out = join(dir, 'pod.stl');
    const { stdout } = await cli([
      'export',
      '--template',
      'round-pod',
      '--params',
      '{"entryHoleDiameterMm":28}',
      '--format',
      'stl',
      '--out',
      out,
    ]);
    const printed = JSON.parse(stdout) as { triangles: number; volumeMm3: number; sha256: string };
    expect(printed.sha256).toMatch(/^[0-9a-f]{64}$/);
    const file = await readFile(out);
    // source: Bourke via trade-facts §6
    expect(file.byteLength).toBe(84 + 50 * printed.triangles);
    // source: Debian admesh 0.98 — no disconnected facets, two parts (pod + floor plug), same volume
    const { stdout: report } = await run('admesh', ['--exact', '--normal-directions', out]);
    expect(report).toMatch(/Total disconnected facets\s*:\s*0\s+0/);
    expect(report).toMatch(/Number of parts\s*:\s*2/);
    const volume = Number(/Volume\s*:\s*([\d.]+)/.exec(report)?.[1]);
    expect(Math.abs(volume - printed.volumeMm3) / printed.volumeMm3).toBeLessThan(1e-3);
  }, 90_000);

  it('exits non-zero with the field and its range for an out-of-range parameter', async () => {
    const err = (await cli([
      'export',
      '--template',
      'gable-box',
      '--params',
      '{"wallThicknessMm":2}',
      '--out',
      join(dir, 'x.stl'),
    ]).catch((e: unknown) => e)) as { code: number; stderr: string };
    expect(err.code).toBe(1);
    expect(err.stderr).toContain('wallThicknessMm must be between 4 and 20 mm');
  }, 90_000);
});
