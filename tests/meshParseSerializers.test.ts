/** Files written by outside serializers (JSCAD's STL and 3MF writers) read back with the right size and shape. */
import { describe, expect, it } from 'vitest';
import jscad from '@jscad/modeling';
import { createRequire } from 'node:module';
import { parseMeshFile } from '../shared/mesh/parseMeshFile';
import { measureMesh } from '../shared/analysis/measureMesh';
import { meshTopology } from '../shared/analysis/meshTopology';

// The JSCAD serializers ship no type declarations: load them untyped and state the one function used.
type Serialize = (options: Record<string, unknown>, ...objects: unknown[]) => unknown[];
const require = createRequire(import.meta.url);
const serializeStl = (require('@jscad/stl-serializer') as { serialize: Serialize }).serialize;
const serialize3mf = (require('@jscad/3mf-serializer') as { serialize: Serialize }).serialize;

/** Joins the serializer's output parts into one byte array. */
function toBytes(parts: unknown[]): Uint8Array {
  const chunks = parts.map((part) =>
    typeof part === 'string' ? new TextEncoder().encode(part) : new Uint8Array(part as ArrayBuffer),
  );
  const out = new Uint8Array(chunks.reduce((n, c) => n + c.length, 0));
  let offset = 0;
  for (const chunk of chunks) {
    out.set(chunk, offset);
    offset += chunk.length;
  }
  return out;
}

const part = jscad.booleans.subtract(
  jscad.primitives.cuboid({ size: [40, 30, 20] }),
  jscad.primitives.cylinder({ radius: 6, height: 30, segments: 32 }),
);
const volume = jscad.measurements.measureVolume(part); // JSCAD's own measurement, an outside reference here
const area = jscad.measurements.measureArea(part);

describe('reading files from outside writers', () => {
  it('binary STL from @jscad/stl-serializer: 84 + 50 N bytes, same volume and area', () => {
    const bytes = toBytes(serializeStl({ binary: true }, part));
    const mesh = parseMeshFile(bytes, 'part.stl');
    // source: Bourke — binary STL size 84 + 50 N
    expect(bytes.length).toBe(84 + 50 * (mesh.indices.length / 3));
    const m = measureMesh(mesh);
    expect(m.volumeMm3 / volume).toBeCloseTo(1, 4);
    expect(m.surfaceAreaMm2 / area).toBeCloseTo(1, 4);
  });

  it('ASCII STL from @jscad/stl-serializer: same volume', () => {
    const bytes = toBytes(serializeStl({ binary: false }, part));
    expect(new TextDecoder().decode(bytes.subarray(0, 5))).toBe('solid');
    expect(measureMesh(parseMeshFile(bytes, 'part.stl')).volumeMm3 / volume).toBeCloseTo(1, 4);
  });

  it('3MF from @jscad/3mf-serializer in inches: scaled to millimetres', () => {
    const mm = measureMesh(parseMeshFile(toBytes(serialize3mf({ unit: 'millimeter' }, part)), 'part.3mf'));
    expect(mm.volumeMm3 / volume).toBeCloseTo(1, 4);
    const inch = parseMeshFile(toBytes(serialize3mf({ unit: 'inch' }, part)), 'part.3mf');
    // source: 3MF Core Spec §Model unit; 1 in = 25.4 mm
    expect(measureMesh(inch).volumeMm3 / (volume * 25.4 ** 3)).toBeCloseTo(1, 4);
    expect(meshTopology(inch).components).toBe(1);
  });
});
