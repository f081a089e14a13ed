import { describe, expect, it } from 'vitest';
import { execFile } from 'node:child_process';
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { AnalysisReportSchema } from '../shared/schemas/analysis';
import { box, geomToMesh, toBinaryStl } from './meshFixtures';

const run = promisify(execFile);

describe('npm run cli -- analyze', () => {
  it('prints the JSON report, a table, and refuses a broken file with exit code 1', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'nw-analyze-'));
    try {
      const file = join(dir, 'block.stl');
      await writeFile(file, toBinaryStl(geomToMesh(box([0, 0, 0], [40, 30, 10]))));
      const cli = ['tsx', 'server/cli/index.ts', 'analyze', '--in', file];
      const json = await run('npx', [...cli, '--up', '+y', '--printer', 'alder-tall-06', '--infill', '20', '--json']);
      const report = AnalysisReportSchema.parse(JSON.parse(json.stdout));
      expect(report.volumeMm3).toBeCloseTo(12000, 3); // analytic: 40 × 30 × 10
      expect(report.bbox.sizeMm[2]).toBeCloseTo(30, 4); // +y up: the 30 mm side is the height
      expect(report.buildPlate.printerId).toBe('alder-tall-06');
      const table = await run('npx', cli);
      expect(table.stdout).toMatch(/Volume\s+12\.0 cm³/);
      expect(table.stdout).toMatch(/Cost per unit/);
      const broken = join(dir, 'broken.stl');
      await writeFile(broken, Buffer.from('not a mesh at all'));
      const failed = await run('npx', ['tsx', 'server/cli/index.ts', 'analyze', '--in', broken]).catch(
        (err: { code: number; stderr: string }) => err,
      );
      expect(failed).toMatchObject({ code: 1 });
      expect((failed as { stderr: string }).stderr).toMatch(/not_a_mesh/);
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  }, 60_000);
});
