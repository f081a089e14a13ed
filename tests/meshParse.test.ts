import { describe, expect, it } from 'vitest';
import { strToU8, zipSync } from 'fflate';
import jscad from '@jscad/modeling';
import { parseStl } from '../shared/mesh/parseStl';
import { parse3mf } from '../shared/mesh/parse3mf';
import { parseMeshFile } from '../shared/mesh/parseMeshFile';
import { MeshFormatError, type MeshFormatReason } from '../shared/mesh/MeshFormatError';
import { measureMesh } from '../shared/analysis/measureMesh';
import { meshTopology } from '../shared/analysis/meshTopology';
import { box, geomToMesh, toAsciiStl, toBinaryStl } from './meshFixtures';

function reasonOf(fn: () => unknown): MeshFormatReason | 'no error' | 'other error' {
  try {
    fn();
    return 'no error';
  } catch (err) {
    return err instanceof MeshFormatError ? err.reason : 'other error';
  }
}

const cube = geomToMesh(box([0, 0, 0], [20, 20, 20]));

describe('parseStl', () => {
  it('reads a binary STL whose size is 84 + 50 N bytes', () => {
    const bytes = toBinaryStl(cube);
    // source: Paul Bourke "STL format" — 80-byte header, uint32 count, 50 bytes per facet
    expect(bytes.length).toBe(84 + 50 * 12);
    const mesh = parseStl(bytes);
    expect(mesh.indices.length / 3).toBe(12);
    expect(mesh.positions.length / 3).toBe(8); // welded: a cube has 8 corners
    expect(measureMesh(mesh).volumeMm3).toBeCloseTo(8000, 6); // analytic: 20³
    expect(meshTopology(mesh).watertight).toBe(true);
  });

  it('reads a binary STL whose header starts with "solid" as binary (by size)', () => {
    // source: freesurferformats docs — readers may mistake such files for ASCII
    const bytes = toBinaryStl(cube);
    bytes.set(strToU8('solid but binary'), 0);
    expect(parseStl(bytes).indices.length / 3).toBe(12);
  });

  it('reads an ASCII STL to the same mesh', () => {
    const mesh = parseStl(strToU8(toAsciiStl(cube)));
    expect(mesh.indices.length / 3).toBe(12);
    expect(measureMesh(mesh).surfaceAreaMm2).toBeCloseTo(2400, 6); // analytic: 6 × 20²
  });

  it('refuses malformed files with a typed reason', () => {
    const good = toBinaryStl(cube);
    expect(reasonOf(() => parseStl(new Uint8Array(0)))).toBe('empty');
    expect(reasonOf(() => parseStl(good.slice(0, good.length - 7)))).toBe('truncated');
    expect(reasonOf(() => parseStl(good.slice(0, 60)))).toBe('truncated');
    const extra = new Uint8Array(good.length + 50 * 3 + 10);
    extra.set(good);
    expect(reasonOf(() => parseStl(extra))).toBe('triangle_count');
    const nan = good.slice();
    new DataView(nan.buffer).setFloat32(84 + 50 * 5 + 12 + 4, Number.NaN, true);
    expect(reasonOf(() => parseStl(nan))).toBe('non_finite');
    const inf = good.slice();
    new DataView(inf.buffer).setFloat32(84 + 12, Number.POSITIVE_INFINITY, true);
    expect(reasonOf(() => parseStl(inf))).toBe('non_finite');
    const flat = new Uint8Array(84 + 50); // one triangle whose corners are all the origin
    new DataView(flat.buffer).setUint32(80, 1, true);
    expect(reasonOf(() => parseStl(flat))).toBe('empty');
    const huge = new Uint8Array(84 + 50);
    new DataView(huge.buffer).setUint32(80, 6_000_000, true);
    expect(reasonOf(() => parseStl(huge))).toBe('too_large');
    const ascii = toAsciiStl(cube);
    expect(reasonOf(() => parseStl(strToU8(ascii.replace('vertex 0 ', 'vertex nan '))))).toBe('non_finite');
    expect(reasonOf(() => parseStl(strToU8(ascii.slice(0, ascii.length / 2))))).toBe('truncated');
    expect(reasonOf(() => parseStl(strToU8('hello, this is a text file and no mesh at all')))).toBe('not_a_mesh');
    const png = new Uint8Array(200);
    png.set([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(reasonOf(() => parseStl(png))).not.toBe('no error');
  });
});

/** A minimal 3MF package. source: 3MF Core Specification v1.2 (OPC package, model part, unit, build items). */
function make3mf(model: string, withRels = true): Uint8Array {
  const files: Record<string, Uint8Array> = {
    '[Content_Types].xml': strToU8(
      '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="model" ContentType="application/vnd.ms-package.3dmanufacturing-3dmodel+xml"/></Types>',
    ),
    'Models/part.model': strToU8(model),
  };
  if (withRels) {
    files['_rels/.rels'] = strToU8(
      '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Target="/Models/part.model" Id="rel0" Type="http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel"/></Relationships>',
    );
  }
  return zipSync(files);
}

/** A unit cube object (outward winding) as 3MF XML. */
function cubeObject(id: number): string {
  const v = [
    [0, 0, 0],
    [1, 0, 0],
    [1, 1, 0],
    [0, 1, 0],
    [0, 0, 1],
    [1, 0, 1],
    [1, 1, 1],
    [0, 1, 1],
  ];
  const t = [
    [0, 2, 1],
    [0, 3, 2],
    [4, 5, 6],
    [4, 6, 7],
    [0, 1, 5],
    [0, 5, 4],
    [1, 2, 6],
    [1, 6, 5],
    [2, 3, 7],
    [2, 7, 6],
    [3, 0, 4],
    [3, 4, 7],
  ];
  return `<object id="${id}" type="model"><mesh><vertices>${v.map(([x, y, z]) => `<vertex x="${x}" y="${y}" z="${z}"/>`).join('')}</vertices><triangles>${t.map(([a, b, c]) => `<triangle v1="${a}" v2="${b}" v3="${c}"/>`).join('')}</triangles></mesh></object>`;
}

describe('parse3mf', () => {
  it('finds the model through _rels/.rels, honours unit="inch" and the build transform', () => {
    const xml = `<?xml version="1.0" encoding="UTF-8"?><model unit="inch" xmlns="http://schemas.microsoft.com/3dmanufacturing/core/2015/02"><resources>${cubeObject(1)}</resources><build><item objectid="1" transform="2 0 0 0 1 0 0 0 1 10 0 0"/></build></model>`;
    const mesh = parse3mf(make3mf(xml));
    const m = measureMesh(mesh);
    // source: 3MF Core Spec §Model — unit inch; 1 in = 25.4 mm (NIST SP 811, 2008: the inch is 25.4 mm exactly)
    expect(m.volumeMm3).toBeCloseTo(2 * 25.4 ** 3, 0);
    expect(m.minMm[0]).toBeCloseTo(10 * 25.4, 3);
    expect(meshTopology(mesh).watertight).toBe(true);
  });

  it('applies component transforms and keeps a mirrored part outward-facing', () => {
    const xml = `<?xml version="1.0"?><model unit="millimeter" xmlns="http://schemas.microsoft.com/3dmanufacturing/core/2015/02"><resources>${cubeObject(1)}<object id="2" type="model"><components><component objectid="1" transform="-10 0 0 0 10 0 0 0 10 0 0 0"/><component objectid="1" transform="10 0 0 0 10 0 0 0 10 20 0 0"/></components></object></resources><build><item objectid="2"/></build></model>`;
    const mesh = parse3mf(make3mf(xml));
    const m = measureMesh(mesh);
    expect(m.volumeMm3).toBeCloseTo(2000, 3); // two 10 mm cubes, one mirrored: volume stays positive
    expect(m.minMm[0]).toBeCloseTo(-10, 4);
    expect(meshTopology(mesh).components).toBe(2);
  });

  it('refuses broken packages with a typed reason', () => {
    const xml = `<?xml version="1.0"?><model unit="millimeter"><resources>${cubeObject(1)}</resources><build><item objectid="1"/></build></model>`;
    const good = make3mf(xml);
    expect(reasonOf(() => parse3mf(good.slice(0, good.length / 2)))).toBe('truncated');
    expect(reasonOf(() => parse3mf(make3mf(xml, false)))).toBe('not_a_mesh'); // model not at the usual path
    expect(reasonOf(() => parse3mf(make3mf(xml.replace('x="1" y="0" z="0"', 'x="NaN" y="0" z="0"'))))).toBe(
      'non_finite',
    );
    expect(reasonOf(() => parse3mf(make3mf(xml.replace('<build><item objectid="1"/></build>', '<build/>'))))).toBe(
      'empty',
    );
    expect(reasonOf(() => parse3mf(make3mf(xml.replace('unit="millimeter"', 'unit="furlong"'))))).toBe('not_a_mesh');
  });
});

describe('parseMeshFile', () => {
  it('dispatches by content, not by name', () => {
    const stl = toBinaryStl(geomToMesh(jscad.primitives.cuboid({ size: [10, 10, 10] })));
    expect(parseMeshFile(stl, 'part.3mf.stl').indices.length / 3).toBe(12);
    const xml = `<?xml version="1.0"?><model><resources>${cubeObject(1)}</resources><build><item objectid="1"/></build></model>`;
    expect(parseMeshFile(make3mf(xml), 'upload.stl').indices.length / 3).toBe(12);
    expect(reasonOf(() => parseMeshFile(strToU8('not a zip'), 'box.3mf'))).toBe('not_a_mesh');
  });
});
