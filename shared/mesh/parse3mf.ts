import { XMLParser } from 'fast-xml-parser';
import type { IndexedMesh } from '../schemas/mesh';
import { MeshFormatError } from './MeshFormatError';
import { MAX_MESH_FILE_BYTES, MAX_MESH_TRIANGLES } from './meshLimits';
import { unzipBounded } from './unzipBounded';
import { weldVertices } from './weldVertices';
import { MM_PER_INCH } from '../format/units';

/** Scale from each 3MF unit to millimetres. source: 3MF Core Specification v1.2, §Model (unit attribute). */
const UNIT_TO_MM: Record<string, number> = {
  micron: 0.001,
  millimeter: 1,
  centimeter: 10,
  inch: MM_PER_INCH,
  foot: 12 * MM_PER_INCH,
  meter: 1000,
};

const MODEL_REL_TYPE = 'http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel';
const IDENTITY: Affine = [1, 0, 0, 0, 1, 0, 0, 0, 1, 0, 0, 0];

/** 3MF affine transform: 12 numbers, row-major, applied to row vectors (p' = p·M). */
type Affine = number[];

interface XmlObject {
  id?: string;
  type?: string;
  mesh?: { vertices?: { vertex?: Record<string, string>[] }; triangles?: { triangle?: Record<string, string>[] } };
  components?: { component?: Record<string, string>[] };
}

const xml = new XMLParser({
  ignoreAttributes: false,
  attributeNamePrefix: '',
  removeNSPrefix: true,
  parseTagValue: false,
  isArray: (name) => ['object', 'vertex', 'triangle', 'item', 'component', 'Relationship'].includes(name),
});

/**
 * Reads a 3MF package into one welded indexed mesh in millimetres: finds the model part through `_rels/.rels`,
 * honours the model's `unit`, and places every build item with its transform and its components' transforms.
 * @param bytes - the whole .3mf file (a ZIP package)
 * @returns the merged mesh of all build items
 * @throws MeshFormatError when the package or model part is missing, malformed or over the limits
 */
export function parse3mf(bytes: Uint8Array): IndexedMesh {
  if (bytes.length === 0) throw new MeshFormatError('empty', 'The file is empty.');
  if (bytes.length > MAX_MESH_FILE_BYTES) {
    throw new MeshFormatError('too_large', `The file is ${bytes.length} bytes; the limit is ${MAX_MESH_FILE_BYTES}.`);
  }
  // Only the relationships and model parts are inflated, with caps on size and ratio (a crafted "zip bomb" is
  // refused after a few MB of inflating instead of filling the memory).
  const files = unzipBounded(bytes, (name) => name.endsWith('.rels') || name.endsWith('.model'));
  const modelPath = findModelPath(files);
  const modelBytes = files[modelPath];
  if (!modelBytes) throw new MeshFormatError('not_a_mesh', 'The 3MF package holds no 3D model part.');
  let doc: { model?: Record<string, unknown> & { unit?: string } };
  try {
    doc = xml.parse(new TextDecoder().decode(modelBytes)) as typeof doc;
  } catch (err) {
    throw new MeshFormatError('not_a_mesh', `The 3MF model part is not valid XML (${(err as Error).message}).`);
  }
  const model = doc.model;
  if (!model) throw new MeshFormatError('not_a_mesh', 'The 3MF model part has no <model> element.');
  const scale = UNIT_TO_MM[model.unit ?? 'millimeter'];
  if (scale === undefined)
    throw new MeshFormatError('not_a_mesh', `The 3MF unit "${model.unit}" is not one the standard names.`);
  const resources = model.resources as { object?: XmlObject[] } | undefined;
  const objects = new Map<string, XmlObject>();
  for (const object of resources?.object ?? []) if (object.id !== undefined) objects.set(object.id, object);
  const items = ((model.build as { item?: Record<string, string>[] } | undefined)?.item ?? []).filter(
    (item) => item.objectid !== undefined,
  );
  const builder = new MeshBuilder();
  for (const item of items) {
    builder.addObject(objects, item.objectid, parseTransform(item.transform), 0);
  }
  if (builder.triangleCount === 0) throw new MeshFormatError('empty', 'The 3MF build holds no triangles.');
  return builder.finish(scale);
}

function findModelPath(files: Record<string, Uint8Array>): string {
  const rels = files['_rels/.rels'];
  if (rels) {
    try {
      const parsed = xml.parse(new TextDecoder().decode(rels)) as {
        Relationships?: { Relationship?: { Type?: string; Target?: string }[] };
      };
      const rel = parsed.Relationships?.Relationship?.find((r) => r.Type === MODEL_REL_TYPE);
      if (rel?.Target) return rel.Target.replace(/^\//, '');
    } catch {
      // a broken .rels falls back to the conventional model path below
    }
  }
  return '3D/3dmodel.model';
}

function parseTransform(text: string | undefined): Affine {
  if (!text) return IDENTITY;
  const values = text.trim().split(/\s+/).map(Number);
  if (values.length !== 12 || values.some((v) => !Number.isFinite(v))) {
    throw new MeshFormatError('not_a_mesh', `The 3MF transform "${text}" is not 12 finite numbers.`);
  }
  return values;
}

/** inner·outer: apply `inner` first, then `outer`. */
function compose(inner: Affine, outer: Affine): Affine {
  const r: number[] = new Array(12);
  for (let row = 0; row < 4; row++) {
    for (let col = 0; col < 3; col++) {
      let sum = row === 3 ? outer[9 + col] : 0;
      for (let k = 0; k < 3; k++) sum += inner[row * 3 + k] * outer[k * 3 + col];
      r[row * 3 + col] = sum;
    }
  }
  return r;
}

function determinant(m: Affine): number {
  return m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
}

class MeshBuilder {
  private positions: number[] = [];
  private indices: number[] = [];

  get triangleCount(): number {
    return this.indices.length / 3;
  }

  addObject(objects: Map<string, XmlObject>, id: string, transform: Affine, depth: number): void {
    if (depth > 16) throw new MeshFormatError('not_a_mesh', 'The 3MF components nest too deeply (a cycle?).');
    const object = objects.get(id);
    if (!object) throw new MeshFormatError('not_a_mesh', `The 3MF build names object ${id}, which does not exist.`);
    for (const component of object.components?.component ?? []) {
      this.addObject(objects, component.objectid, compose(parseTransform(component.transform), transform), depth + 1);
    }
    const vertices = object.mesh?.vertices?.vertex ?? [];
    const triangles = object.mesh?.triangles?.triangle ?? [];
    if (this.triangleCount + triangles.length > MAX_MESH_TRIANGLES) {
      throw new MeshFormatError('too_large', `The 3MF build holds over ${MAX_MESH_TRIANGLES} triangles.`);
    }
    const base = this.positions.length / 3;
    const m = transform;
    for (const [i, vertex] of vertices.entries()) {
      const x = Number(vertex.x);
      const y = Number(vertex.y);
      const z = Number(vertex.z);
      if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) {
        throw new MeshFormatError('non_finite', `3MF object ${id}, vertex ${i}: a coordinate is not a finite number.`);
      }
      this.positions.push(
        x * m[0] + y * m[3] + z * m[6] + m[9],
        x * m[1] + y * m[4] + z * m[7] + m[10],
        x * m[2] + y * m[5] + z * m[8] + m[11],
      );
    }
    const mirrored = determinant(m) < 0; // a mirroring transform turns the winding inside out
    for (const [i, triangle] of triangles.entries()) {
      const v = [Number(triangle.v1), Number(triangle.v2), Number(triangle.v3)];
      if (v.some((k) => !Number.isInteger(k) || k < 0 || k >= vertices.length)) {
        throw new MeshFormatError('not_a_mesh', `3MF object ${id}, triangle ${i}: a vertex index is out of range.`);
      }
      if (mirrored) this.indices.push(base + v[0], base + v[2], base + v[1]);
      else this.indices.push(base + v[0], base + v[1], base + v[2]);
    }
  }

  /** Scales to mm and welds: some writers give every triangle its own corners, and objects may share corners. */
  finish(scale: number): IndexedMesh {
    const soup = new Float32Array(this.indices.length * 3);
    for (let i = 0; i < this.indices.length; i++) {
      const v = this.indices[i] * 3;
      soup[i * 3] = this.positions[v] * scale;
      soup[i * 3 + 1] = this.positions[v + 1] * scale;
      soup[i * 3 + 2] = this.positions[v + 2] * scale;
    }
    return weldVertices(soup);
  }
}
