/**
 * The 3MF export of a design, parsed back: each part is its own named object ("body", "floor plug"), the material
 * and colour are the core's base materials that every object refers to, and the build items place the parts on the
 * plate as the plate rule lays them out (together when a set fits, else one plate each). The package read back by
 * our own reader has the design's volume; manifold-3d accepts each object as a closed manifold.
 * source: 3MF Core Specification v1.3, 3MF Consortium, 2022 (§3.4.3 build items and transforms, §4 objects,
 * §4.1 base materials, displaycolor as sRGB #RRGGBBAA).
 */
import { unzipSync, strFromU8 } from 'fflate';
import { XMLParser } from 'fast-xml-parser';
import { beforeAll, describe, expect, it } from 'vitest';
import { layoutUnitOnPlates } from '../shared/analysis/plateLayout';
import { fitPartSizes } from '../shared/analysis/fitParts';
import { design3mf, PLATE_GAP_MM } from '../shared/mesh/design3mf';
import { parse3mf } from '../shared/mesh/parse3mf';
import { THREEMF_CORE_NAMESPACE } from '../shared/mesh/write3mf';
import { generate, type GenerateResult } from '../templates/generate';
import { meshVolumeMm3 } from '../templates/lib/meshVolumeMm3';
import { loadManifold } from './meshFixtures';

interface ModelXml {
  model: {
    xmlns: string;
    unit: string;
    metadata?: Array<{ name: string; '#text': string }>;
    resources: {
      basematerials?: Array<{ id: string; base: Array<{ name: string; displaycolor: string }> }>;
      object: Array<{
        id: string;
        name: string;
        type: string;
        pid?: string;
        pindex?: string;
        mesh: { vertices: { vertex: Array<{ x: string; y: string; z: string }> }; triangles: { triangle: unknown[] } };
      }>;
    };
    build: { item: Array<{ objectid: string; transform?: string }> };
  };
}

const xml = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: '',
  isArray: (name) => ['object', 'vertex', 'triangle', 'item', 'base', 'basematerials', 'metadata'].includes(name),
});

function readModel(bytes: Uint8Array): ModelXml {
  return xml.parse(strFromU8(unzipSync(bytes)['3D/3dmodel.model'])) as ModelXml;
}

/** Box [min, max] of one object's vertices after its build item's transform (row vectors, translation last). */
function placedBox(model: ModelXml, objectId: string): { min: number[]; max: number[] } {
  const object = model.model.resources.object.find((o) => o.id === objectId)!;
  const item = model.model.build.item.find((i) => i.objectid === objectId)!;
  const m = (item.transform ?? '1 0 0 0 1 0 0 0 1 0 0 0').split(' ').map(Number);
  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (const v of object.mesh.vertices.vertex) {
    const [x, y, z] = [Number(v.x), Number(v.y), Number(v.z)];
    const p = [0, 1, 2].map((c) => x * m[c] + y * m[3 + c] + z * m[6 + c] + m[9 + c]);
    p.forEach((value, axis) => {
      min[axis] = Math.min(min[axis], value);
      max[axis] = Math.max(max[axis], value);
    });
  }
  return { min, max };
}

const MOSS = { name: 'PLA, Moss green', displayColour: '#5f6f3a' };
let gable: GenerateResult;
beforeAll(async () => {
  gable = await generate('gable-box', {});
}, 120_000);

describe('design3mf', () => {
  it('writes each part as a named object in the base material, read back with its volume', () => {
    const bytes = design3mf(gable, { buildVolumeMm: [400, 400, 300], material: MOSS });
    const model = readModel(bytes);
    expect(model.model.xmlns).toBe(THREEMF_CORE_NAMESPACE);
    expect(model.model.unit).toBe('millimeter');
    const objects = model.model.resources.object;
    expect(objects.map((o) => o.name)).toEqual(gable.partNames.map((n) => n.replace('-', ' ')));
    expect(objects.map((o) => o.name)).toEqual(['body', 'floor plug']);
    const group = model.model.resources.basematerials![0];
    expect(group.base).toEqual([{ name: 'PLA, Moss green', displaycolor: '#5F6F3AFF' }]);
    for (const object of objects) {
      expect(object.type).toBe('model');
      expect(object.pid).toBe(group.id);
      expect(object.pindex).toBe('0');
    }
    expect(model.model.build.item.map((i) => i.objectid)).toEqual(objects.map((o) => o.id));
    // Our reader (transforms applied) gives the design's volume back.
    const read = parse3mf(bytes);
    expect(Math.abs(meshVolumeMm3(read) - gable.volumeMm3) / gable.volumeMm3).toBeLessThan(1e-4);
  });

  it('each object is a closed manifold (manifold-3d)', async () => {
    const wasm = await loadManifold();
    const bytes = design3mf(gable, { buildVolumeMm: [400, 400, 300], material: MOSS });
    const model = readModel(bytes);
    for (const object of model.model.resources.object) {
      const vertProperties = Float32Array.from(
        object.mesh.vertices.vertex.flatMap((v) => [Number(v.x), Number(v.y), Number(v.z)]),
      );
      const triVerts = Uint32Array.from(
        (object.mesh.triangles.triangle as Array<{ v1: string; v2: string; v3: string }>).flatMap((t) => [
          Number(t.v1),
          Number(t.v2),
          Number(t.v3),
        ]),
      );
      const solid = new wasm.Manifold(new wasm.Mesh({ numProp: 3, vertProperties, triVerts }));
      expect(solid.status(), object.name).toBe('NoError');
      expect(solid.volume()).toBeGreaterThan(0);
      solid.delete();
    }
  });

  it('places the parts together on one plate when a set fits, apart and on the plate', () => {
    const plate = [400, 400, 300];
    const model = readModel(design3mf(gable, { buildVolumeMm: plate }));
    expect(model.model.resources.basematerials).toBeUndefined();
    const boxes = model.model.resources.object.map((o) => placedBox(model, o.id));
    for (const box of boxes) {
      expect(box.min[0]).toBeGreaterThanOrEqual(-1e-3);
      expect(box.min[1]).toBeGreaterThanOrEqual(-1e-3);
      expect(box.min[2]).toBeCloseTo(0, 3);
      expect(box.max[0]).toBeLessThanOrEqual(plate[0] + 1e-3);
      expect(box.max[1]).toBeLessThanOrEqual(plate[1] + 1e-3);
    }
    const [a, b] = boxes;
    const apartX = a.max[0] + 10 - 1e-3 <= b.min[0] || b.max[0] + 10 - 1e-3 <= a.min[0];
    const apartY = a.max[1] + 10 - 1e-3 <= b.min[1] || b.max[1] + 10 - 1e-3 <= a.min[1];
    expect(apartX || apartY).toBe(true);
    expect(model.model.metadata?.find((m) => m.name === 'Description')?.['#text']).toContain('all parts on one');
  });

  it('gives each part a plate of its own when a set does not fit, as the plate rule counts', () => {
    const plate = [220, 220, 250];
    const layout = layoutUnitOnPlates(
      [
        [182, 165, 239],
        [132, 140, 6],
      ],
      plate,
    );
    expect(
      fitPartSizes(
        [
          [182, 165, 239],
          [132, 140, 6],
        ],
        plate,
      ).setsPerPlate,
    ).toBe(0);
    expect(layout.layout).toBe('separate');
    expect(layout.plates).toBe(2);
    expect(layout.placements.map((p) => p.plate)).toEqual([0, 1]);
    // Centred on its plate.
    expect(layout.placements[0].xMm).toBeCloseTo((220 - 182) / 2, 6);
    expect(layout.placements[1].yMm).toBeCloseTo((220 - 140) / 2, 6);

    const small = design3mf(gable, { buildVolumeMm: plate });
    const model = readModel(small);
    const fit = fitPartSizes(
      model.model.resources.object.map((o) => {
        const box = placedBox(model, o.id);
        return [0, 1, 2].map((axis) => box.max[axis] - box.min[axis]);
      }),
      plate,
    );
    if (fit.setsPerPlate === 0) {
      const boxes = model.model.resources.object.map((o) => placedBox(model, o.id));
      // The second part sits on the second plate, to the right of the first plate and its gap.
      expect(boxes[1].min[0]).toBeGreaterThanOrEqual(plate[0] + PLATE_GAP_MM - 1e-3);
      expect(boxes[0].max[0]).toBeLessThanOrEqual(plate[0] + 1e-3);
    }
  });
});
