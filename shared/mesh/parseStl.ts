import type { IndexedMesh } from '../schemas/mesh';
import { MeshFormatError } from './MeshFormatError';
import { MAX_MESH_FILE_BYTES, MAX_MESH_TRIANGLES } from './meshLimits';
import { weldVertices } from './weldVertices';

const HEADER_BYTES = 80;
const FACET_BYTES = 50;

/**
 * Reads an STL file, binary or ASCII, into a welded indexed mesh in millimetres (STL carries no unit).
 * Binary is recognised by its size, 84 + 50·N bytes for the N facets the header declares, never by the word
 * "solid", which some binary writers put in their header.
 * @param bytes - the whole file
 * @returns the welded mesh
 * @throws MeshFormatError when the file is empty, truncated, declares the wrong triangle count, holds NaN or
 *   infinite coordinates, is over the size limit or is not an STL mesh
 */
export function parseStl(bytes: Uint8Array): IndexedMesh {
  if (bytes.length === 0) throw new MeshFormatError('empty', 'The file is empty.');
  if (bytes.length > MAX_MESH_FILE_BYTES) {
    throw new MeshFormatError('too_large', `The file is ${bytes.length} bytes; the limit is ${MAX_MESH_FILE_BYTES}.`);
  }
  if (bytes.length >= HEADER_BYTES + 4) {
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const declared = view.getUint32(HEADER_BYTES, true);
    if (HEADER_BYTES + 4 + FACET_BYTES * declared === bytes.length)
      return nonEmpty(weldVertices(readBinary(view, declared)));
  }
  if (looksLikeAsciiStl(bytes)) return nonEmpty(weldVertices(readAscii(bytes)));
  if (!looksBinary(bytes)) throw new MeshFormatError('not_a_mesh', 'The file is text but not an ASCII STL.');
  if (bytes.length < HEADER_BYTES + 4) {
    throw new MeshFormatError('truncated', `The file is ${bytes.length} bytes, shorter than a binary STL header (84).`);
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const declared = view.getUint32(HEADER_BYTES, true);
  const expected = HEADER_BYTES + 4 + FACET_BYTES * declared;
  if (declared > MAX_MESH_TRIANGLES) {
    throw new MeshFormatError(
      'too_large',
      `The file declares ${declared} triangles; the limit is ${MAX_MESH_TRIANGLES}.`,
    );
  }
  if (bytes.length < expected) {
    throw new MeshFormatError(
      'truncated',
      `The file declares ${declared} triangles (${expected} bytes) but holds only ${bytes.length} bytes.`,
    );
  }
  throw new MeshFormatError(
    'triangle_count',
    `The file declares ${declared} triangles (${expected} bytes) but is ${bytes.length} bytes long.`,
  );
}

function nonEmpty(mesh: IndexedMesh): IndexedMesh {
  if (mesh.indices.length === 0) {
    throw new MeshFormatError('empty', 'Every triangle in the file is degenerate (two or more corners coincide).');
  }
  return mesh;
}

function readBinary(view: DataView, count: number): Float32Array {
  if (count === 0) throw new MeshFormatError('empty', 'The STL file declares no triangles.');
  if (count > MAX_MESH_TRIANGLES) {
    throw new MeshFormatError('too_large', `The file holds ${count} triangles; the limit is ${MAX_MESH_TRIANGLES}.`);
  }
  const soup = new Float32Array(count * 9);
  for (let t = 0; t < count; t++) {
    const base = HEADER_BYTES + 4 + t * FACET_BYTES + 12; // skip the stored normal: it is recomputed from winding
    for (let k = 0; k < 9; k++) {
      const value = view.getFloat32(base + k * 4, true);
      if (!Number.isFinite(value)) {
        throw new MeshFormatError('non_finite', `Triangle ${t + 1} has a coordinate that is not a finite number.`);
      }
      soup[t * 9 + k] = value;
    }
  }
  return soup;
}

function looksLikeAsciiStl(bytes: Uint8Array): boolean {
  const head = new TextDecoder('latin1').decode(bytes.subarray(0, Math.min(bytes.length, 512)));
  return /^\s*solid\b/i.test(head) && !looksBinary(bytes.subarray(0, Math.min(bytes.length, 4096)));
}

/** True when the bytes hold control characters that text never does. */
function looksBinary(bytes: Uint8Array): boolean {
  const n = Math.min(bytes.length, 4096);
  for (let i = 0; i < n; i++) {
    const b = bytes[i];
    if (b === 0 || (b < 32 && b !== 9 && b !== 10 && b !== 13 && b !== 12)) return true;
  }
  return false;
}

function readAscii(bytes: Uint8Array): Float32Array {
  const text = new TextDecoder('latin1').decode(bytes);
  // Scan keywords with regular expressions instead of splitting the whole text into tokens (memory stays ~1× file).
  const keyword = /\b(facet|vertex|endsolid)\b/gi;
  const token = /\s*(\S+)/y;
  let values = new Float32Array(1024);
  let count = 0;
  let facets = 0;
  let sawEnd = false;
  for (let match = keyword.exec(text); match; match = keyword.exec(text)) {
    const word = match[1].toLowerCase();
    if (word === 'vertex') {
      if (count + 3 > values.length) {
        const grown = new Float32Array(values.length * 2);
        grown.set(values);
        values = grown;
      }
      token.lastIndex = keyword.lastIndex;
      for (let k = 0; k < 3; k++) {
        const found = token.exec(text);
        if (!found) throw new MeshFormatError('truncated', `The ASCII STL ends inside vertex ${count / 3 + 1}.`);
        const raw = found[1];
        const value = Number(raw);
        if (!Number.isFinite(value)) {
          const what = /^[-+]?(nan|inf)/i.test(raw) ? 'non_finite' : 'not_a_mesh';
          throw new MeshFormatError(
            what,
            `Vertex ${Math.floor(count / 3) + 1} has the coordinate "${raw}", not a finite number.`,
          );
        }
        values[count++] = value;
      }
      keyword.lastIndex = token.lastIndex;
    } else if (word === 'facet') {
      facets++;
      if (facets > MAX_MESH_TRIANGLES) {
        throw new MeshFormatError('too_large', `The file holds over ${MAX_MESH_TRIANGLES} triangles.`);
      }
    } else {
      sawEnd = true;
    }
  }
  if (count === 0) throw new MeshFormatError(facets ? 'truncated' : 'empty', 'The ASCII STL holds no vertices.');
  if (count !== facets * 9) {
    throw new MeshFormatError(
      sawEnd ? 'triangle_count' : 'truncated',
      `The ASCII STL has ${facets} facets but ${count / 3} vertices (3 per facet expected).`,
    );
  }
  if (!sawEnd) throw new MeshFormatError('truncated', 'The ASCII STL has no "endsolid" line; the file is cut short.');
  return values.slice(0, count);
}
