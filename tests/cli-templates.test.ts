/**
 * The CLI commands `templates --json` and `export`, run as a real process through `npm run cli`; the exported file
 * is checked with Debian's admesh.
 */
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
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
    const printed = JSON.parse(stdout) as {
      triangles: number;
      volumeMm3: number;
      meshSha256: string;
      fileSha256: string;
    };
    expect(printed).not.toHaveProperty('sha256');
    expect(printed.meshSha256).toMatch(/^[0-9a-f]{64}$/);
    const file = await readFile(out);
    // source: node:crypto, an independent sha256 of the bytes on disk
    expect(printed.fileSha256).toBe(createHash('sha256').update(file).digest('hex'));
    expect(printed.fileSha256).not.toBe(printed.meshSha256);
    // source: Bourke
    expect(file.byteLength).toBe(84 + 50 * printed.triangles);
    // source: Debian admesh 0.98 — no disconnected facets, two parts (pod + floor plug), same volume
    const { stdout: report } = await run('admesh', ['--exact', '--normal-directions', out]);
    expect(report).toMatch(/Total disconnected facets\s*:\s*0\s+0/);
    expect(report).toMatch(/Number of parts\s*:\s*2/);
    const volume = Number(/Volume\s*:\s*([\d.]+)/.exec(report)?.[1]);
    expect(Math.abs(volume - printed.volumeMm3) / printed.volumeMm3).toBeLessThan(1e-3);
  }, 90_000);

  it('exits with 2 and the usage line, no stack trace, for an out-of-range parameter', async () => {
    const err = (await cli([
      'export',
      '--template',
      'gable-box',
      '--params',
      '{"wallThicknessMm":2}',
      '--out',
      join(dir, 'x.stl'),
    ]).catch((e: unknown) => e)) as { code: number; stderr: string };
    expect(err.code).toBe(2);
    expect(err.stderr).toMatch(/between 4 and 20 mm/);
    expect(err.stderr).toContain('Usage: npm run cli -- export');
    expect(err.stderr).not.toMatch(/\n\s+at /);
  }, 90_000);

  it.each([
    [['export', '--template', 'gable-box', '--out', 'x.stl', '--bogus']],
    [['export', '--template', 'no-such-template', '--out', 'x.stl']],
    [['export', '--template', 'gable-box', '--out', 'x.stl', '--colour', 'plaid']],
    [['export', '--template', 'gable-box']],
    [['templates', '--bogus']],
  ])(
    'exits with 2 and a usage line for bad arguments %j',
    async (args: string[]) => {
      const err = (await cli(args).catch((e: unknown) => e)) as { code: number; stderr: string };
      expect(err.code).toBe(2);
      expect(err.stderr).toMatch(/^Usage: npm run cli -- (export|templates)/m);
      expect(err.stderr).not.toMatch(/\n\s+at /);
    },
    90_000,
  );
});
