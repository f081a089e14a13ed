import type { IndexedMesh } from '../schemas/mesh';
import { MeshFormatError } from './MeshFormatError';
import { parse3mf } from './parse3mf';
import { parseStl } from './parseStl';

/**
 * Reads an uploaded mesh file, choosing the reader by content: a ZIP package (`PK\x03\x04`) is read as 3MF,
 * anything else as STL. The file name is only used to make the error clearer.
 * @param bytes - the whole file
 * @param filename - the uploaded name, if known
 * @returns the welded mesh in millimetres
 * @throws MeshFormatError with the reason the file was refused
 */
export function parseMeshFile(bytes: Uint8Array, filename?: string): IndexedMesh {
  if (bytes.length === 0) throw new MeshFormatError('empty', `${filename ?? 'The file'} is empty.`);
  const isZip = bytes.length >= 4 && bytes[0] === 0x50 && bytes[1] === 0x4b && bytes[2] === 0x03 && bytes[3] === 0x04;
  if (isZip) return parse3mf(bytes);
  if (filename && /\.3mf$/i.test(filename)) {
    throw new MeshFormatError('not_a_mesh', `${filename} is named .3mf but is not a ZIP package.`);
  }
  return parseStl(bytes);
}
