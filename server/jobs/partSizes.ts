import type { IndexedMesh } from '../../shared/schemas/mesh';

/**
 * Bounding-box size of every connected body of a mesh (bodies joined by shared vertices), largest volume first.
 * A template's parts (box body, floor plug) can go on separate plates, so each must fit the printer on its own.
 * @param mesh - the mesh in build orientation, mm
 * @returns one [x, y, z] size per body
 */
export function partSizesMm(mesh: IndexedMesh): Array<[number, number, number]> {
  const vertexCount = mesh.positions.length / 3;
  const parent = new Uint32Array(vertexCount);
  for (let i = 0; i < vertexCount; i++) parent[i] = i;
  const root = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  for (let t = 0; t < mesh.indices.length; t += 3) {
    const a = root(mesh.indices[t]);
    const b = root(mesh.indices[t + 1]);
    const c = root(mesh.indices[t + 2]);
    parent[b] = a;
    parent[c] = a;
  }
  const boxes = new Map<number, number[]>();
  for (let t = 0; t < mesh.indices.length; t++) {
    const v = mesh.indices[t];
    const r = root(v);
    let box = boxes.get(r);
    if (!box) {
      box = [Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity];
      boxes.set(r, box);
    }
    for (let axis = 0; axis < 3; axis++) {
      const value = mesh.positions[v * 3 + axis];
      if (value < box[axis]) box[axis] = value;
      if (value > box[axis + 3]) box[axis + 3] = value;
    }
  }
  return [...boxes.values()]
    .map((box): [number, number, number] => [box[3] - box[0], box[4] - box[1], box[5] - box[2]])
    .sort((a, b) => b[0] * b[1] * b[2] - a[0] * a[1] * a[2]);
}
