/**
 * Packs a per-face 0/1 mask into a bitset (bit i of byte i>>3, least significant first) as base64 for JSON.
 * @param mask - one byte per face, non-zero = set
 * @returns base64 text
 */
export function encodeFaceBitset(mask: Uint8Array): string {
  const bits = new Uint8Array((mask.length + 7) >> 3);
  for (let i = 0; i < mask.length; i++) if (mask[i]) bits[i >> 3] |= 1 << (i & 7);
  let binary = '';
  for (let i = 0; i < bits.length; i += 0x8000) binary += String.fromCharCode(...bits.subarray(i, i + 0x8000));
  return btoa(binary);
}

/**
 * Unpacks a base64 face bitset into one byte per face (the viewer's overhang mask).
 * @param base64 - text from {@link encodeFaceBitset}
 * @param faceCount - number of triangles
 * @returns one byte per face, 1 = set
 */
export function decodeFaceBitset(base64: string, faceCount: number): Uint8Array {
  const binary = atob(base64);
  const mask = new Uint8Array(faceCount);
  for (let i = 0; i < faceCount; i++) mask[i] = (binary.charCodeAt(i >> 3) >> (i & 7)) & 1;
  return mask;
}
