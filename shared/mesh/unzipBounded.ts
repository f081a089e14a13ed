import { Unzip, UnzipInflate } from 'fflate';
import { MeshFormatError } from './MeshFormatError';

/** Largest total inflated size of the parts read from one 3MF package (512 MiB; 5 M triangles of XML fit). */
export const MAX_INFLATED_BYTES = 512 * 1024 * 1024;
/**
 * Largest ratio of inflated to compressed bytes of one part once it is past {@link RATIO_FLOOR_BYTES}. Mesh XML
 * deflates by about 3 to 15 times; a crafted package ("zip bomb") by hundreds to thousands.
 */
export const MAX_INFLATE_RATIO = 100;
/** Parts smaller than this (inflated) are not held to the ratio: tiny XML parts compress very well. */
export const RATIO_FLOOR_BYTES = 1024 * 1024;
/** Compressed bytes handed to the inflater at a time, so a refusal comes after at most a few MB of output. */
const CHUNK_BYTES = 4 * 1024;

/** Limits of {@link unzipBounded}. */
export interface UnzipLimits {
  /** Largest total inflated size of the kept parts. */
  maxInflatedBytes?: number;
  /** Largest inflated/compressed ratio of one part (past the floor). */
  maxRatio?: number;
}

/**
 * Unzips a package while counting: parts are inflated in small steps and the unzipping stops, with a
 * MeshFormatError ('too_large'), as soon as the total inflated size or one part's inflated/compressed ratio passes
 * its limit. Only the parts `keep` accepts are inflated; the others are skipped without inflating them.
 * @param bytes - the whole ZIP file
 * @param keep - which part names to inflate and return
 * @param limits - see {@link UnzipLimits}
 * @returns the kept parts by name
 * @throws MeshFormatError when a limit is passed or the package cannot be read
 */
export function unzipBounded(
  bytes: Uint8Array,
  keep: (name: string) => boolean,
  limits: UnzipLimits = {},
): Record<string, Uint8Array> {
  if (!hasEndOfCentralDirectory(bytes)) {
    throw new MeshFormatError('truncated', 'The 3MF package has no ZIP directory at its end; the file is cut short.');
  }
  const maxInflated = limits.maxInflatedBytes ?? MAX_INFLATED_BYTES;
  const maxRatio = limits.maxRatio ?? MAX_INFLATE_RATIO;
  const files: Record<string, Uint8Array> = {};
  let totalInflated = 0;
  let consumed = 0;
  let refusal: MeshFormatError | undefined;
  const unfinished = new Set<string>();
  const unzip = new Unzip((file) => {
    if (!keep(file.name) || refusal) return;
    const chunks: Uint8Array[] = [];
    let inflated = 0;
    const startedAt = consumed;
    unfinished.add(file.name);
    file.ondata = (err, data, final) => {
      if (refusal) return;
      if (err) {
        refusal = new MeshFormatError('truncated', `The 3MF package cannot be unzipped (${err.message}).`);
        return;
      }
      inflated += data.length;
      totalInflated += data.length;
      // Compressed bytes of this part so far: what was pushed since it began (never the size the header claims).
      const compressed = Math.max(consumed - startedAt, 1);
      if (totalInflated > maxInflated) {
        refusal = new MeshFormatError(
          'too_large',
          `The 3MF package unpacks to more than ${Math.round(maxInflated / 1024 / 1024)} MB; it is refused.`,
        );
      } else if (inflated > RATIO_FLOOR_BYTES && inflated / compressed > maxRatio) {
        refusal = new MeshFormatError(
          'too_large',
          `A part of the 3MF package unpacks to over ${maxRatio} times its packed size, which no mesh does; ` +
            'the file is refused.',
        );
      }
      if (refusal) {
        file.terminate();
        return;
      }
      chunks.push(data);
      if (final) {
        files[file.name] = concat(chunks, inflated);
        unfinished.delete(file.name);
      }
    };
    file.start();
  });
  unzip.register(UnzipInflate);
  try {
    for (let offset = 0; offset < bytes.length && !refusal; offset += CHUNK_BYTES) {
      const end = Math.min(offset + CHUNK_BYTES, bytes.length);
      consumed = end;
      unzip.push(bytes.subarray(offset, end), end === bytes.length);
    }
  } catch (err) {
    if (!refusal) {
      throw new MeshFormatError('truncated', `The 3MF package cannot be unzipped (${(err as Error).message}).`);
    }
  }
  if (refusal) throw refusal;
  if (unfinished.size > 0) {
    throw new MeshFormatError('truncated', 'The 3MF package ends in the middle of a part; the file is cut short.');
  }
  return files;
}

/**
 * Every ZIP file ends with an end-of-central-directory record (signature PK 05 06) followed by a comment of at most
 * 65,535 bytes; a package without one was cut short. source: APPNOTE.TXT, .ZIP File Format Specification, PKWARE,
 * 2022, section 4.3.16
 */
function hasEndOfCentralDirectory(bytes: Uint8Array): boolean {
  const earliest = Math.max(0, bytes.length - 22 - 65_535);
  for (let at = bytes.length - 22; at >= earliest; at--) {
    if (bytes[at] === 0x50 && bytes[at + 1] === 0x4b && bytes[at + 2] === 0x05 && bytes[at + 3] === 0x06) return true;
  }
  return false;
}

function concat(chunks: Uint8Array[], length: number): Uint8Array {
  if (chunks.length === 1) return chunks[0];
  const out = new Uint8Array(length);
  let at = 0;
  for (const chunk of chunks) {
    out.set(chunk, at);
    at += chunk.length;
  }
  return out;
}
