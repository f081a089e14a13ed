/**
 * STL and 3MF writers checked against the formats' published layouts and re-read by outside readers
 * (three.js STLLoader, fflate unzip + the 3MF core XML).
 */
import { unzipSync, strFromU8 } from 'fflate';
import { STLLoader } from 'three/examples/jsm/loaders/STLLoader.js';
import { beforeAll, describe, expect, it } from 'vitest';
import { THREEMF_CORE_NAMESPACE, write3mf } from '../shared/mesh/write3mf';
import { writeStl } from '../shared/mesh/writeStl';
import { canonicalMeshBytes, meshHash } from '../shared/mesh/meshHash';
import { generate, type GenerateResult } from '../templates/index';

let design: GenerateResult;
beforeAll(async () => {
  design = await generate('gable-box', { trimStyle: 'shingles' });
});

describe('binary STL', () => {
  it('is 84 + 50·N bytes with the triangle count at byte 80', () => {
    const bytes = writeStl(design.mesh);
    const n = design.mesh.indices.length / 3;
    // source: Paul Bourke "STL format" — 80-byte header, uint32 count, 50 bytes per facet
    expect(bytes.byteLength).toBe(84 + 50 * n);
    expect(new DataView(bytes.buffer).getUint32(80, true)).toBe(n);
    // source: freesurferformats docs — a binary header must not start with "solid"
    expect(new TextDecoder().decode(bytes.subarray(0, 5))).not.toBe('solid');
  });

  it('reads back with three.js STLLoader: same vertices, unit normals along the right-hand winding', () => {
    const bytes = writeStl(design.mesh);
    const geometry = new STLLoader().parse(bytes.buffer as ArrayBuffer);
    const read = geometry.getAttribute('position');
    const normals = geometry.getAttribute('normal');
    expect(read.count).toBe(design.mesh.indices.length);
    const p = design.mesh.positions;
    for (let corner = 0; corner < read.count; corner += 97) {
      const v = design.mesh.indices[corner] * 3;
      expect(read.getX(corner)).toBe(p[v]);
      expect(read.getY(corner)).toBe(p[v + 1]);
      expect(read.getZ(corner)).toBe(p[v + 2]);
    }
    for (let tri = 0; tri < read.count / 3; tri += 31) {
      const [a, b, c] = [0, 1, 2].map((k) => [read.getX(tri * 3 + k), read.getY(tri * 3 + k), read.getZ(tri * 3 + k)]);
      const u = [b[0] - a[0], b[1] - a[1], b[2] - a[2]];
      const w = [c[0] - a[0], c[1] - a[1], c[2] - a[2]];
      const cross = [u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0]];
      const length = Math.hypot(...cross);
      const n = [normals.getX(tri * 3), normals.getY(tri * 3), normals.getZ(tri * 3)];
      expect(Math.hypot(...n)).toBeCloseTo(1, 5);
      // source: Bourke — the normal follows the right-hand rule of the vertex order
      expect((n[0] * cross[0] + n[1] * cross[1] + n[2] * cross[2]) / length).toBeCloseTo(1, 4);
    }
  });
});

describe('3MF package', () => {
  it('holds the OPC parts, the core namespace, millimetres and every triangle', () => {
    const files = unzipSync(write3mf(design.mesh, { unit: 'millimeter' }));
    // source: 3MF Core Specification — OPC zip with content types, root relationship, model part
    expect(Object.keys(files).sort()).toEqual(['3D/3dmodel.model', '[Content_Types].xml', '_rels/.rels']);
    expect(strFromU8(files['[Content_Types].xml'])).toContain('application/vnd.ms-package.3dmanufacturing-3dmodel+xml');
    const rels = strFromU8(files['_rels/.rels']);
    expect(rels).toContain('Target="/3D/3dmodel.model"');
    expect(rels).toContain('http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel');
    const model = strFromU8(files['3D/3dmodel.model']);
    expect(THREEMF_CORE_NAMESPACE).toBe('http://schemas.microsoft.com/3dmanufacturing/core/2015/02');
    expect(model).toContain(`xmlns="${THREEMF_CORE_NAMESPACE}"`);
    // source: 3MF Core Spec §Model — unit attribute, millimetre is the default and our unit
    expect(model).toMatch(/<model unit="millimeter"/);
    const triangles = [...model.matchAll(/<triangle v1="(\d+)" v2="(\d+)" v3="(\d+)"\/>/g)];
    const vertices = [...model.matchAll(/<vertex x="([^"]+)" y="([^"]+)" z="([^"]+)"\/>/g)];
    expect(triangles.length).toBe(design.triangles);
    expect(vertices.length).toBe(design.mesh.positions.length / 3);
    // coordinates read back to the same float32 values, indices unchanged (winding kept)
    for (let i = 0; i < vertices.length; i += 53) {
      for (let k = 0; k < 3; k++)
        expect(Math.fround(Number(vertices[i][k + 1]))).toBe(design.mesh.positions[i * 3 + k]);
    }
    for (let t = 0; t < triangles.length; t += 41) {
      for (let k = 0; k < 3; k++) expect(Number(triangles[t][k + 1])).toBe(design.mesh.indices[t * 3 + k]);
    }
    // source: 3MF Core Spec — an object of type "model" needs at least 4 triangles
    expect(model).toContain('type="model"');
  });

  it('writes the same bytes for the same mesh (no clock in the zip)', () => {
    expect(write3mf(design.mesh)).toEqual(write3mf(design.mesh));
  });
});

describe('mesh hash', () => {
  it('is sha256 over positions quantised to 1 µm and the indices', async () => {
    const hash = await meshHash(design.mesh);
    // source: node:crypto as an independent sha256 of the same canonical bytes
    const { createHash } = await import('node:crypto');
    expect(hash).toBe(createHash('sha256').update(canonicalMeshBytes(design.mesh)).digest('hex'));
    const moved = {
      positions: design.mesh.positions.map((v, i) => (i === 0 ? v + 0.01 : v)),
      indices: design.mesh.indices,
    };
    expect(await meshHash(moved)).not.toBe(hash);
  });
});
